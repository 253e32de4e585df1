import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    // The compute worker bundle (dist/workers) from the current sources, for services the tests call directly.
    globalSetup: ['tests/helpers/build-workers.setup.ts'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    // expect.poll gives up after 1 s by default: too short for a browser on a busy 2-core machine.
    expect: { poll: { timeout: 10_000 } },
    // Browser and HTTP tests share one server and database; files run one after another
    // so a lockout test cannot disturb a sign-in test.
    fileParallelism: false,
    // The validation reporter writes reports/validation.{json,md} whenever reference values were compared.
    reporters: ['default', './tests/reporters/validation-reporter.ts'],
  },
});
