import { describe, expect, it } from 'vitest';
import { readNumber } from '../../../src/lib/paste/read-number';

// Number conventions of spreadsheets (common practice): a decimal point (en) or a decimal comma
// (de, fr, ...); thousands grouped by the other sign. A lone comma followed by three digits is
// read both ways in the wild, so it is refused.
const cases: Array<[string, number | 'ambiguous' | 'not a number' | 'empty']> = [
  ['480', 480],
  ['480.5', 480.5],
  ['480,5', 480.5],
  [' 480,50 ', 480.5],
  ['-3,25', -3.25],
  ['.5', 0.5],
  [',5', 0.5],
  ['0,125', 0.125],
  ['1e3', 1000],
  ['2.5E-2', 0.025],
  ['1,234', 'ambiguous'],
  ['12,345', 'ambiguous'],
  ['1,234.5', 1234.5],
  ['1.234,5', 1234.5],
  ['12.345.678,9', 12345678.9],
  ['1,23,4', 'not a number'],
  ['480 m', 'not a number'],
  ['4 80', 'not a number'],
  ['1.234.5', 'not a number'],
  ['abc', 'not a number'],
  ['', 'empty'],
  ['   ', 'empty'],
];

describe('readNumber', () => {
  it.each(cases)('%j → %j', (cell, expected) => {
    const r = readNumber(cell);
    if (typeof expected === 'number') expect(r).toEqual({ value: expected });
    else if (expected === 'empty') expect(r).toEqual({ empty: true });
    else {
      expect('error' in r).toBe(true);
      expect((r as { error: string }).error).toContain(expected === 'ambiguous' ? 'ambiguous' : 'not a number');
    }
  });
});
