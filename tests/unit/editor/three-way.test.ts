import { describe, expect, it } from 'vitest';
import { applyMerge, mergeFields } from '../../../src/lib/merge/three-way';

const base = { title: 'A', soil: 100, sections: [{ id: 'S1', lengthM: 500 }, { id: 'S2', lengthM: 500 }], cases: [{ id: 'K1' }] };

describe('three-way merge of inputs', () => {
  it('takes each side’s own change and flags a field both changed', () => {
    const mine = { ...base, title: 'A mine', sections: [{ id: 'S1', lengthM: 480.5 }, { id: 'S2', lengthM: 500 }] };
    const theirs = { ...base, soil: 50, sections: [{ id: 'S1', lengthM: 490 }, { id: 'S2', lengthM: 510 }] };
    const fields = mergeFields(base, mine, theirs);
    expect(fields.map((f) => [f.path, f.conflict])).toEqual([
      ['title', false],
      ['soil', false],
      ['sections.0.lengthM', true],
      ['sections.1.lengthM', false],
    ]);
    expect(applyMerge(theirs, fields)).toEqual({ title: 'A mine', soil: 50, sections: [{ id: 'S1', lengthM: 480.5 }, { id: 'S2', lengthM: 510 }], cases: [{ id: 'K1' }] });
    expect(applyMerge(theirs, fields, { 'sections.0.lengthM': 'theirs', title: 'theirs' })).toMatchObject({ title: 'A', sections: [{ lengthM: 490 }, { lengthM: 510 }] });
  });

  it('treats a list whose length changed on both sides as one field', () => {
    const mine = { ...base, cases: [{ id: 'K1' }, { id: 'K2' }] };
    const theirs = { ...base, cases: [] };
    const fields = mergeFields(base, mine, theirs);
    expect(fields).toEqual([{ path: 'cases', base: base.cases, mine: mine.cases, theirs: [], conflict: true }]);
    expect(applyMerge(theirs, fields)).toEqual(mine);
  });

  it('finds nothing when both made the same change', () => {
    const same = { ...base, soil: 70 };
    expect(mergeFields(base, same, structuredClone(same))).toEqual([]);
  });
});
