import { describe, expect, it } from 'vitest';
import { previewSections } from '../../../src/lib/paste/sections-paste';

const opts = { defaultLayoutId: 'L1', layoutIds: ['L1', 'L2'] };
const lengths = (text: string) => previewSections(text, opts).rows.map((r) => r.section?.lengthM ?? null);

// Each row: the pasted text, the lengths read (null = that row refused), and whether it may be applied.
const table: Array<[string, string, Array<number | null>, boolean]> = [
  ['tab cells with a decimal comma', 'S1\t480,5\tL1\t0\nS2\t500\tL1\t1', [480.5, 500], true],
  ['semicolon CSV with decimal commas', 'id;length;layout;shift\nS1;480,5;L1;0\nS2;1.234,5;L2;2', [480.5, 1234.5], true],
  ['comma CSV with a quoted decimal comma', 'id,length\nS1,"480,5"\nS2,500.25', [480.5, 500.25], true],
  ['comma CSV with an unquoted decimal comma: refused, not split', 'id,length\nS1,480,5\nS2,500', [null, 500], false],
  ['lengths only, decimal points', '480.5\n500\n', [480.5, 500], true],
  ['lengths only with a comma: a number or two columns? refused', '480,5\n500,25', [null, null], false],
  ['one row with a decimal comma among plain lengths: refused by count', '500\n480,5\n600', [500, null, 600], false],
  ['the odd row first: the usual count still wins', '480,5\n500\n600', [null, 500, 600], false],
  ['tab cells, ambiguous thousands', 'S1\t1,250\tL1\t0', [null], false],
  ['tab cells, grouped with a point', 'S1\t1,250.5\tL1\t0', [1250.5], true],
  ['negative length refused', 'S1\t-5\tL1\t0', [null], false],
  ['unknown layout refused on its row', 'S1\t480\tL9\t0\nS2\t10\tL2\t0', [null, 10], false],
  ['bad shift refused', 'S1\t480\tL1\t3', [null], false],
  ['duplicate id refused on the second', 'S1\t480\nS1\t500', [480, null], false],
  ['blank lines ignored, Windows line ends', 'S1\t480\r\n\r\nS2\t500\r\n', [480, 500], true],
  ['export format round trip', 'id,lengthM,layoutId,phaseRotation\nS1,480.5,L1,0\nS2,500,L2,1\n', [480.5, 500], true],
];

describe('previewSections', () => {
  it.each(table)('%s', (_name, text, expected, ok) => {
    const p = previewSections(text, opts);
    expect(lengths(text)).toEqual(expected);
    expect(p.ok).toBe(ok);
    // A refused row says why, with its line number; an accepted one has no error.
    for (const row of p.rows) {
      if (row.section) expect(row.errors).toEqual([]);
      else expect(row.errors.join(' ')).toMatch(new RegExp(`Line ${row.line}\\b`));
    }
  });

  it('never reads 480,5 as 480 and 5, even where a layout is called 5', () => {
    for (const text of ['480,5', 'S1,480,5', 'S1,480,5,L1', 'S1,480,5,L1,0', '480,5\n500\n600', 'S1,480,5\nS2,500,5']) {
      const p = previewSections(text, { defaultLayoutId: 'L1', layoutIds: ['L1', '5'] });
      expect(p.ok).toBe(false);
      expect(p.rows.some((r) => r.section?.lengthM === 480 || r.section?.lengthM === 5)).toBe(false);
    }
  });

  it('names the columns and fills ids and layouts when only lengths are given', () => {
    const p = previewSections('480.5\n500', opts);
    expect(p.rows.map((r) => r.section)).toEqual([
      { id: 'S1', lengthM: 480.5, layoutId: 'L1', phaseRotation: 0 },
      { id: 'S2', lengthM: 500, layoutId: 'L1', phaseRotation: 0 },
    ]);
  });

  it('refuses an empty paste and an unknown header', () => {
    expect(previewSections(' \n\n', opts).problems[0]).toMatch(/Nothing to read/);
    const p = previewSections('id\tlength\tcolour\nS1\t5\tred', opts);
    expect(p.ok).toBe(false);
    expect(p.problems.join(' ')).toMatch(/colour/);
  });
});
