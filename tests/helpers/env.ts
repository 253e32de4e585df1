/** Settings that scripts/test.sh exports for the suite. */
export function testEnv() {
  const need = (name: string) => {
    const value = process.env[name];
    if (!value) throw new Error(`${name} is not set: run the suite with npm test.`);
    return value;
  };
  return {
    appUrl: need('APP_URL'),
    databaseUrl: need('DATABASE_URL'),
    mailWebUrl: `http://127.0.0.1:${need('MAILDEV_WEB_PORT')}`,
    artifacts: process.env.TEST_ARTIFACTS ?? 'test-artifacts',
  };
}

export const DEMO_PASSWORD = 'sheathwise-demo';
