import { expect, type TestContext } from 'vitest';
import { compareValue, toleranceText, type Tolerance, type ValidationCheck } from '../../src/lib/methods/validation-report';

// Reference-value comparisons that also feed the validation report: each comparison is
// recorded in the test's metadata (which vitest hands to reporters across workers), then
// asserted. The reporter (tests/reporters/validation-reporter.ts) writes reports/validation.*.

declare module 'vitest' {
  interface TaskMeta {
    validation?: ValidationCheck[];
  }
}

export const relative = (value: number): Tolerance => ({ kind: 'relative', value });
export const absolute = (value: number): Tolerance => ({ kind: 'absolute', value });
/** The tolerance of toBeCloseTo(expected, n): half a unit in the n-th decimal place. */
export const decimals = (n: number): Tolerance => ({ kind: 'absolute', value: 10 ** -n / 2 });

export type CompareReference = (quantity: string, engine: number, expected: number, unit: string, tolerance: Tolerance) => void;

/**
 * Compares engine figures with the reference values of one check-value id (docs/methods.md).
 * `source` is the document and clause, or the formula the expected value is derived from.
 */
export function referenceValues(task: TestContext['task'], id: string, source: string): CompareReference {
  return (quantity, engine, expected, unit, tolerance) => {
    const check = compareValue({ id, quantity, source, expected, engine, unit, tolerance, test: task.name });
    (task.meta.validation ??= []).push(check);
    expect(check.within, `${id} ${quantity}: engine ${engine} ${unit}, expected ${expected} ${unit} (${toleranceText(tolerance)})`).toBe(true);
  };
}
