import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { checkValueSections } from '../../../src/lib/methods/method-statement';
import { buildValidationReport, compareValue, validationMarkdown, validationSummary, type ValidationCheck } from '../../../src/lib/methods/validation-report';
import { validationProblems } from '../../../src/lib/methods/validation-problems';

// The report generator on a small invented fixture: a three-value statement and five recorded
// comparisons, one outside its tolerance and one with an id the statement does not define.

const statement = readFileSync('tests/fixtures/validation/statement.md', 'utf8');
const recorded = JSON.parse(readFileSync('tests/fixtures/validation/checks.json', 'utf8')) as Array<Omit<ValidationCheck, 'difference' | 'within'>>;
const checks = recorded.map(compareValue);
const sections = checkValueSections(statement);
const report = buildValidationReport({ engineVersion: '9.1.0', generatedAt: '2026-01-02', checks, failedTests: ['QB-2 voltage'], sections });

describe('the validation report generator', () => {
  it('reads which section defines each check value, once per id', () => {
    expect([...sections.entries()]).toEqual([
      ['QA-1', { section: '1', title: 'Earth return' }],
      ['QB-2', { section: '2', title: 'Sheath voltages' }],
      ['QB-10', { section: '2', title: 'Sheath voltages' }],
    ]);
  });

  it('judges each value against its own tolerance, absolute or relative', () => {
    const within = Object.fromEntries(checks.map((c) => [`${c.id} ${c.quantity}`, c.within]));
    expect(within).toEqual({ 'QB-10 Is': true, 'QB-2 E on sheath a': true, 'QB-2 E on sheath b': false, 'QA-1 De': true, 'QZ-9 stray': true });
    expect(checks[1].difference).toBeCloseTo(0.004, 12);
    expect(compareValue({ ...recorded[0], engine: Number.NaN }).within).toBe(false);
  });

  it('groups by section in the statement order, ids in natural order, undefined ids last', () => {
    expect(report.groups.map((g) => [g.section, g.title, g.checks.map((c) => c.id)])).toEqual([
      ['1', 'Earth return', ['QA-1']],
      ['2', 'Sheath voltages', ['QB-2', 'QB-2', 'QB-10']],
      ['', 'Not defined in the method statement', ['QZ-9']],
    ]);
    expect(report.ids).toEqual(['QA-1', 'QB-2', 'QB-10', 'QZ-9']);
    expect([report.total, report.within]).toEqual([5, 4]);
    expect(validationSummary(report)).toBe('Validation of engine 9.1.0: 4 of 5 reference values within tolerance');
  });

  it('writes Markdown with the summary, the failed test and a row per value (pipes escaped)', () => {
    const md = validationMarkdown(report);
    expect(md.split('\n')[0]).toBe('# Validation of engine 9.1.0: 4 of 5 reference values within tolerance');
    expect(md).toContain('- QB-2 voltage');
    expect(md).toContain('## 2. Sheath voltages');
    expect(md).toContain('| QB-2 | E on sheath b | fixture | 5 V | 5.006 V | 0.006 | 0.001 relative | NO |');
    expect(md).toContain('| QA-1 | De | fixture \\| with a pipe | 10 m | 10.004 m | 0.004 | ± 0.005 | yes |');
    expect(md.match(/^\| Q[A-Z]-\d+ \|/gm)).toHaveLength(5);
  });

  it('says why a report does not stand for an engine version', () => {
    expect(validationProblems(report, '9.2.0', sections.keys())).toEqual([
      'the validation report is for engine 9.1.0, the code is engine 9.2.0: run `npm run validation`',
      '1 of 5 reference values are outside tolerance',
      'tests citing check values failed: QB-2 voltage',
      'check values in the report that docs/methods.md does not define: QZ-9',
    ]);
    expect(validationProblems(undefined, '9.2.0', [])[0]).toContain('no validation report for engine 9.2.0');
    const clean = buildValidationReport({ engineVersion: '9.1.0', generatedAt: '2026-01-02', checks: checks.filter((c) => c.within && c.id !== 'QZ-9' && c.id !== 'QA-1'), sections });
    expect(validationProblems(clean, '9.1.0', sections.keys())).toEqual(['check values in docs/methods.md that the report does not cover: QA-1']);
  });
});
