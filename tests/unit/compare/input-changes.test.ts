import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { describeInputChanges } from '../../../src/lib/compare/input-changes';
import { verdictChanges, worstChanges } from '../../../src/lib/compare/result-changes';

const fixture = () => JSON.parse(readFileSync('tests/fixtures/studies/fernhollow-cross-bonded.json', 'utf8'));

describe('revision comparison in words', () => {
  it('names a changed field by its entry and unit', () => {
    const a = fixture();
    const b = fixture();
    b.sections[1].lengthM = 520;
    expect(describeInputChanges(a, b)).toEqual(['section M1b length 498 m → 520 m']);
  });

  it('reads an inserted section as one addition, not every later section changed', () => {
    const a = fixture();
    const b = fixture();
    b.sections.splice(2, 0, { id: 'M1x', lengthM: 40, layoutId: 'TRE' });
    b.bonding[0].sectionIds.push('M1x');
    b.svls = b.svls.filter((s: { jointIndex: number }) => s.jointIndex !== 5);
    b.earthing.linkBoxOhm = 10;
    b.cases[0].currents[0].currentA = 900;
    expect(describeInputChanges(a, b)).toEqual([
      'section M1x added (id M1x, length 40 m, layout TRE)',
      'bonding group 1 sections M1a, M1b, M1c → M1a, M1b, M1c, M1x',
      'earthing link-box earth resistance 5 Ω → 10 Ω',
      'SVL at joint 5 removed',
      'case LOAD circuit C1 current 850 A → 900 A',
    ]);
  });

  it('names joint bays, ECC transposition points and bonding leads by length', () => {
    const a = fixture();
    a.eccs = [{ id: 'E1', name: 'ECC', resistanceOhmPerKm: 0.06, gmrMm: 8, fromSectionId: 'M1a', toSectionId: 'M1c', transposedAtMidpoint: false }];
    const b = structuredClone(a);
    b.jointNames = [{ jointIndex: 2, name: 'Mill Lane' }];
    b.eccs[0].transposedAtJoints = [2, 1];
    b.bondingLeadLength = { lengthM: 12, resistanceMilliohmPerM: 0.08 };
    b.svls.find((v: { jointIndex: number }) => v.jointIndex === 2).continuousRatingV = 4000;
    const before = a.svls.find((v: { jointIndex: number }) => v.jointIndex === 2).continuousRatingV;
    expect(describeInputChanges(a, b)).toEqual([
      `SVL at joint bay Mill Lane (joint 2) continuous rating ${before} V → 4000 V`,
      'ECC E1 transposition points none → joint 1, joint bay Mill Lane (joint 2)',
      'joint 2 named Mill Lane',
      'bonding lead by length set to length 12 m, resistance per metre 0.08 mΩ/m',
    ]);
    const c = structuredClone(b);
    c.jointNames[0].name = 'Mill Lane bay';
    c.eccs[0].transposedAtJoints = [1];
    expect(describeInputChanges(b, c)).toEqual(['ECC E1 transposition points joint 1, joint bay Mill Lane bay (joint 2) → joint 1', 'joint 2 name Mill Lane → Mill Lane bay']);
    expect(describeInputChanges(c, a)).toContain('joint 2 no longer named Mill Lane bay');
    // An empty list of crossings is stored as none: the change between them is not worth a sentence.
    const d = structuredClone(a);
    d.eccs[0].transposedAtJoints = [];
    expect(describeInputChanges(d, a)).toEqual([]);
  });

  it('finds nothing between equal inputs', () => {
    expect(describeInputChanges(fixture(), fixture())).toEqual([]);
  });

  it('states worst values and verdicts that moved', () => {
    const before = { kind: 'bonding', worst: [{ quantity: 'standing-voltage-normal', value: 40, unit: 'V' }] } as never;
    const after = { kind: 'bonding', worst: [{ quantity: 'standing-voltage-normal', value: 50, unit: 'V' }] } as never;
    expect(worstChanges(before, after)[0].text).toBe('Standing voltage, normal load 40.00 V → 50.00 V (+25 %)');
    const item = (status: string) => ({ itemKey: 'standing-voltage-normal:LOAD', kind: 'computed', title: 'Standing voltage', caseId: 'LOAD', status });
    expect(verdictChanges([item('pass')], [item('fail')]).map((v) => v.text)).toEqual(['Standing voltage, case LOAD: PASS → FAIL']);
  });
});
