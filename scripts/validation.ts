import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { ENGINE_VERSION } from '../src/lib/calc/constants';
import { checkValueSections } from '../src/lib/methods/method-statement';
import { validationProblems } from '../src/lib/methods/validation-problems';
import { validationSummary } from '../src/lib/methods/validation-report';
import { committedValidationPath, readReport } from './validation-files';

// npm run validation: runs the calculation core's unit tests, which compare the engine with
// every check value of docs/methods.md, and commits their report as
// docs/validation/engine-<version>.json, the file the build embeds and requires.

const root = path.resolve(import.meta.dirname, '..');
const reportDir = 'reports';
const run = spawnSync(path.join(root, 'node_modules/.bin/vitest'), ['run', 'tests/unit/calc', '--reporter=default', '--reporter=./tests/reporters/validation-reporter.ts'], {
  cwd: root,
  stdio: 'inherit',
  env: { ...process.env, SHEATHWISE_VALIDATION_DIR: reportDir },
});
const report = readReport(path.join(root, reportDir, 'validation.json'));
const problems = validationProblems(report, ENGINE_VERSION, checkValueSections(readFileSync(path.join(root, 'docs/methods.md'), 'utf8')).keys());
if (run.status !== 0) problems.unshift(`the calculation core's tests failed (exit ${run.status})`);
if (problems.length) {
  console.error(`Not written: the validation of engine ${ENGINE_VERSION} does not stand.\n- ${problems.join('\n- ')}`);
  process.exit(1);
}
const target = committedValidationPath(root, ENGINE_VERSION);
mkdirSync(path.dirname(target), { recursive: true });
writeFileSync(target, `${JSON.stringify(report, null, 2)}\n`);
console.log(`${validationSummary(report!)}: written to ${path.relative(root, target)}`);
