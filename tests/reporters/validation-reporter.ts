import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Reporter, TestModule, Vitest } from 'vitest/node';
import { ENGINE_VERSION } from '../../src/lib/calc/constants';
import { checkValueIdsIn, checkValueSections } from '../../src/lib/methods/method-statement';
import { buildValidationReport, validationMarkdown, validationSummary, type ValidationCheck } from '../../src/lib/methods/validation-report';

/**
 * Writes reports/validation.json and reports/validation.md at the end of a run that compared
 * any reference value (tests/helpers/validation.ts records them in each test's metadata). A
 * run without such comparisons leaves the previous report alone. `npm run validation` turns
 * the report into the committed docs/validation/engine-<version>.json.
 */
export default class ValidationReporter implements Reporter {
  private root = process.cwd();

  onInit(vitest: Vitest) {
    this.root = vitest.config.root;
  }

  onTestRunEnd(testModules: ReadonlyArray<TestModule>) {
    const sections = checkValueSections(readFileSync(path.join(this.root, 'docs/methods.md'), 'utf8'));
    const checks: ValidationCheck[] = [];
    const failedTests: string[] = [];
    for (const module of testModules) {
      for (const test of module.children.allTests()) {
        const recorded = test.meta().validation ?? [];
        checks.push(...recorded.map((c) => ({ ...c, test: test.fullName })));
        const citesCheckValue = recorded.length > 0 || checkValueIdsIn(test.name).some((id) => sections.has(id));
        if (citesCheckValue && test.result().state === 'failed') failedTests.push(test.fullName);
      }
    }
    if (!checks.length && !failedTests.length) return;
    const report = buildValidationReport({ engineVersion: ENGINE_VERSION, generatedAt: new Date().toISOString().slice(0, 10), checks, failedTests, sections });
    const dir = path.join(this.root, process.env.SHEATHWISE_VALIDATION_DIR ?? 'reports');
    mkdirSync(dir, { recursive: true });
    writeFileSync(path.join(dir, 'validation.json'), `${JSON.stringify(report, null, 2)}\n`);
    writeFileSync(path.join(dir, 'validation.md'), validationMarkdown(report));
    console.log(`${validationSummary(report)} (${path.relative(this.root, dir)}/validation.md)`);
  }
}
