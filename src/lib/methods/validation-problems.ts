import type { ValidationReport } from './validation-report';

/**
 * What stops a validation report from standing for an engine version: it is for another
 * version, a value is outside tolerance, a test citing a check value failed, or its ids differ
 * from those the method statement defines. An empty list means the report stands.
 */
export function validationProblems(report: ValidationReport | undefined, engineVersion: string, statementIds: Iterable<string>): string[] {
  if (!report) return [`no validation report for engine ${engineVersion}: run \`npm run validation\` and commit docs/validation/engine-${engineVersion}.json`];
  const problems: string[] = [];
  if (report.engineVersion !== engineVersion) problems.push(`the validation report is for engine ${report.engineVersion}, the code is engine ${engineVersion}: run \`npm run validation\``);
  if (report.within !== report.total) problems.push(`${report.total - report.within} of ${report.total} reference values are outside tolerance`);
  if (report.failedTests.length) problems.push(`tests citing check values failed: ${report.failedTests.join('; ')}`);
  const stated = new Set(statementIds);
  const covered = new Set(report.ids);
  const unvalidated = [...stated].filter((id) => !covered.has(id));
  const undefinedIds = [...covered].filter((id) => !stated.has(id));
  if (unvalidated.length) problems.push(`check values in docs/methods.md that the report does not cover: ${unvalidated.join(', ')}`);
  if (undefinedIds.length) problems.push(`check values in the report that docs/methods.md does not define: ${undefinedIds.join(', ')}`);
  return problems;
}
