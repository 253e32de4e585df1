import { describe, expect, it } from 'vitest';
import { decodeCursor, encodeCursor, type KeyType } from '../../../src/lib/db/keyset-cursor';
import { AppError } from '../../../src/lib/errors';

// A page position goes back into SQL as typed keys: only what the list gave out for this order,
// with every key readable as its type, may pass; anything else is a field error on `after`.

const ID = '3f2a1b4c-5d6e-4f70-8a9b-0c1d2e3f4a5b';
const refusal = (fn: () => unknown) => {
  try {
    fn();
  } catch (err) {
    return err instanceof AppError ? err.fields.map((f) => f.field) : 'other error';
  }
  return 'accepted';
};

describe('keyset positions', () => {
  it('give back what was encoded, for the same order', () => {
    const cases: Array<[KeyType[], string[]]> = [
      [['text'], ['B10']],
      [['timestamptz'], ['2026-12-02 10:15:51.123456+00']],
      [['timestamptz'], ['2024-02-29 23:59:59+05:30']],
      [['smallint', 'date'], ['2', '9999-12-31']],
      [['float8'], ['-12.5']],
      [['float8'], ['1e+20']],
    ];
    for (const [types, keys] of cases) expect(decodeCursor(encodeCursor('code asc', keys, ID), 'code asc', types, 'the list')).toEqual([keys, ID]);
  });

  it('refuse another order, a wrong count, a bad id and keys their type cannot read', () => {
    const at = (keys: string[], order = 'code asc', id = ID) => encodeCursor(order, keys, id);
    expect(refusal(() => decodeCursor(at(['B10'], 'code desc'), 'code asc', ['text'], 'the list'))).toEqual(['after']);
    expect(refusal(() => decodeCursor(at(['B10', 'x']), 'code asc', ['text'], 'the list'))).toEqual(['after']);
    expect(refusal(() => decodeCursor(at(['B10'], 'code asc', 'no-id'), 'code asc', ['text'], 'the list'))).toEqual(['after']);
    expect(refusal(() => decodeCursor('%%%', 'code asc', ['text'], 'the list'))).toEqual(['after']);
    const unreadable: Array<[KeyType, string]> = [
      ['timestamptz', 'not a date'],
      ['timestamptz', '2026-02-30 10:00:00+00'],
      ['timestamptz', '2026-12-02 25:00:00+00'],
      ['date', '2026-13-01'],
      ['date', '2026-02-29'],
      ['float8', 'FHX-C2'],
      ['float8', 'Infinity'],
      ['smallint', '99999'],
      ['smallint', 'z'],
    ];
    for (const [type, key] of unreadable) expect(refusal(() => decodeCursor(at([key]), 'code asc', [type], 'the list')), `${type} ${key}`).toEqual(['after']);
  });
});
