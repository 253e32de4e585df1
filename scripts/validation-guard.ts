import { fileURLToPath } from 'node:url';
import type { AstroIntegration } from 'astro';
import { committedValidationProblems } from './validation-files';

/**
 * Fails `astro build` when the engine version in src/lib/calc/constants.ts has no committed
 * validation report that stands (docs/validation/engine-<version>.json): a new engine version
 * needs a new `npm run validation`.
 */
export function validationGuard(): AstroIntegration {
  let root = process.cwd();
  return {
    name: 'sheathwise:validation-guard',
    hooks: {
      'astro:config:done': ({ config }) => {
        root = fileURLToPath(config.root);
      },
      'astro:build:start': ({ logger }) => {
        const problems = committedValidationProblems(root);
        if (problems.length) throw new Error(`The engine's validation does not stand:\n- ${problems.join('\n- ')}`);
        logger.info('the committed validation covers this engine version');
      },
    },
  };
}
