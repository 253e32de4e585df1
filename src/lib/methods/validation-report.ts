// The validation report: every reference value the engine's tests compare it with, grouped by
// the section of the method statement that defines it. Pure: the vitest reporter, the
// `npm run validation` script, the method page and the record all build on these functions.

/** How close the engine must come: |engine − expected| ≤ value, or ≤ value·|expected| for relative. */
export interface Tolerance {
  kind: 'absolute' | 'relative';
  value: number;
}

/** One reference value as a test compared it. */
export interface ValidationCheck {
  id: string;
  /** What was compared, in words: "E on each sheath", "Is". */
  quantity: string;
  /** Where the expected value comes from (document and clause, or the formula it is derived from). */
  source: string;
  expected: number;
  engine: number;
  unit: string;
  /** engine − expected. */
  difference: number;
  tolerance: Tolerance;
  within: boolean;
  /** The test's full name. */
  test: string;
}

export interface ValidationGroup {
  /** Section number in docs/methods.md, or '' for ids the statement does not define. */
  section: string;
  title: string;
  checks: ValidationCheck[];
}

export interface ValidationReport {
  engineVersion: string;
  /** ISO date of the run. */
  generatedAt: string;
  total: number;
  within: number;
  /** Every check-value id covered, sorted. */
  ids: string[];
  /** Tests that cite a check value and failed, by name (a failure before any comparison is recorded here too). */
  failedTests: string[];
  groups: ValidationGroup[];
}

/** Compares one value and says whether it is within tolerance. */
export function compareValue(c: Omit<ValidationCheck, 'difference' | 'within'>): ValidationCheck {
  const difference = c.engine - c.expected;
  const allowed = c.tolerance.kind === 'relative' ? c.tolerance.value * Math.abs(c.expected) : c.tolerance.value;
  return { ...c, difference, within: Number.isFinite(c.engine) && Math.abs(difference) <= allowed };
}

const bySectionNumber = (a: string, b: string) => {
  if (!a) return 1;
  if (!b) return -1;
  const [x, y] = [a.split('.').map(Number), b.split('.').map(Number)];
  return x[0] - y[0] || (x[1] ?? 0) - (y[1] ?? 0);
};

const naturalId = (a: string, b: string) => a.slice(0, 2).localeCompare(b.slice(0, 2)) || Number(a.slice(3)) - Number(b.slice(3));

/** Builds the report from the recorded checks, grouped by the section defining each id (`sections` from checkValueSections). */
export function buildValidationReport(input: {
  engineVersion: string;
  generatedAt: string;
  checks: ValidationCheck[];
  failedTests?: string[];
  sections: Map<string, { section: string; title: string }>;
}): ValidationReport {
  const groups = new Map<string, ValidationGroup>();
  for (const check of input.checks) {
    const where = input.sections.get(check.id) ?? { section: '', title: 'Not defined in the method statement' };
    if (!groups.has(where.section)) groups.set(where.section, { section: where.section, title: where.title, checks: [] });
    groups.get(where.section)!.checks.push(check);
  }
  const ordered = [...groups.values()].sort((a, b) => bySectionNumber(a.section, b.section));
  // Stable order inside a group: by id, then in the order the test compared them.
  ordered.forEach((g) => g.checks.sort((a, b) => naturalId(a.id, b.id)));
  return {
    engineVersion: input.engineVersion,
    generatedAt: input.generatedAt,
    total: input.checks.length,
    within: input.checks.filter((c) => c.within).length,
    ids: [...new Set(input.checks.map((c) => c.id))].sort(naturalId),
    failedTests: [...(input.failedTests ?? [])].sort(),
    groups: ordered,
  };
}

/** "Validation of engine 2.0.0: 52 of 52 reference values within tolerance". */
export const validationSummary = (r: Pick<ValidationReport, 'engineVersion' | 'total' | 'within'>): string =>
  `Validation of engine ${r.engineVersion}: ${r.within} of ${r.total} reference values within tolerance`;

/** A number as the report prints it: enough digits to show a difference at the tolerance. */
export function reportNumber(v: number): string {
  if (v === 0) return '0';
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  return a >= 1e-3 && a < 1e6 ? String(Number(v.toPrecision(7))) : Number(v.toPrecision(5)).toExponential();
}

export const toleranceText = (t: Tolerance): string => (t.kind === 'relative' ? `${reportNumber(t.value)} relative` : `± ${reportNumber(t.value)}`);

/** The report as Markdown: the summary, then one table per section. */
export function validationMarkdown(r: ValidationReport): string {
  const cell = (s: string) => s.replace(/\|/g, '\\|').replace(/\n/g, ' ');
  const lines = [`# ${validationSummary(r)}`, '', `Run of ${r.generatedAt}; ${r.ids.length} check-value ids.`, ''];
  if (r.failedTests.length) lines.push('Failed tests:', '', ...r.failedTests.map((t) => `- ${cell(t)}`), '');
  for (const g of r.groups) {
    lines.push(`## ${g.section ? `${g.section}. ` : ''}${g.title}`, '', '| id | quantity | source | expected | engine | difference | tolerance | within |', '|---|---|---|---|---|---|---|---|');
    for (const c of g.checks) {
      lines.push(`| ${c.id} | ${cell(c.quantity)} | ${cell(c.source)} | ${reportNumber(c.expected)} ${c.unit} | ${reportNumber(c.engine)} ${c.unit} | ${reportNumber(c.difference)} | ${toleranceText(c.tolerance)} | ${c.within ? 'yes' : 'NO'} |`);
    }
    lines.push('');
  }
  return lines.join('\n');
}
