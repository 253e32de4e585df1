import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { checkValueSections } from '../src/lib/methods/method-statement';
import { validationProblems } from '../src/lib/methods/validation-problems';
import type { ValidationReport } from '../src/lib/methods/validation-report';

// The committed validation of each engine version, and the check that it still stands. Used
// by `npm run validation`, by the build (astro.config.mjs) and by a unit test.

export const committedValidationPath = (root: string, engineVersion: string): string => path.join(root, 'docs/validation', `engine-${engineVersion}.json`);

export function readReport(file: string): ValidationReport | undefined {
  return existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as ValidationReport) : undefined;
}

/** The engine version as written in src/lib/calc/constants.ts (read as text, so the build needs no TypeScript loader). */
export function engineVersionIn(root: string): string {
  const source = readFileSync(path.join(root, 'src/lib/calc/constants.ts'), 'utf8');
  const m = /export const ENGINE_VERSION = '([^']+)'/.exec(source);
  if (!m) throw new Error('src/lib/calc/constants.ts: ENGINE_VERSION not found; keep it a plain string constant');
  return m[1];
}

/** Problems with the committed validation for the engine version in the code; empty when it stands. */
export function committedValidationProblems(root: string, engineVersion = engineVersionIn(root)): string[] {
  const ids = checkValueSections(readFileSync(path.join(root, 'docs/methods.md'), 'utf8')).keys();
  return validationProblems(readReport(committedValidationPath(root, engineVersion)), engineVersion, ids);
}
