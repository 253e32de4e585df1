import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';
import { bondingLeadImpedance } from '../../../src/lib/calc/bonding/bonding-lead';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { decimals, referenceValues, relative } from '../../helpers/validation';

// A cross-bonding lead given by its length: per-metre figures, or the resistance derived from
// its conductor. Either way the network sees one impedance per lead, as if typed as a total.

const fixture = () => JSON.parse(readFileSync('tests/fixtures/studies/fernhollow-cross-bonded.json', 'utf8'));
const issuesOf = (input: unknown) => {
  const r = bondingStudySchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
};

describe('bonding lead by length', () => {
  it('BL-1: 10 m of 240 mm² copper at 50 °C: R = 0.80307 mΩ; R20 against the IEC 60228 class 2 maximum [derived; published, from memory]', ({ task }) => {
    const check = referenceValues(task, 'BL-1', "docs/methods.md §2.2: IEC 60287-1-1 Table 1 ρ20 and eq. (2); IEC 60228 Table 2 (class 2, 240 mm² Cu: 0.0754 Ω/km maximum at 20 °C, from memory)");
    const lead = bondingLeadImpedance({ bondingLeadLength: { lengthM: 10 }, bondingLeads: { crossSectionMm2: 240, material: 'copper' }, adiabatic: { initialC: 50, finalC: 160 } });
    // R20 = ρ20/A = 1.7241e-8 / 240e-6 Ω/m; R50 = R20·(1 + 0.00393·30); × 10 m.
    check('lead R', lead.ohm.re * 1000, 0.80307, 'mΩ', decimals(5));
    expect(lead.ohm.im).toBe(0);
    // The nominal area's ρ/A sits a few per cent under the standard's maximum (stranding, tolerances).
    const r20 = lead.figures.find((f) => f.key === 'leadR20')!.value;
    check('R20 of the lead conductor against IEC 60228', r20, 0.0754, 'Ω/km', relative(0.05));
    expect(r20).toBeLessThan(0.0754);
    expect(lead.figures.map((f) => f.source).join(' ')).toContain('IEC 60287-1-1');
  });

  it('per-metre figures give exactly the result of the same total typed as one impedance', () => {
    const total = { ...fixture(), bondingLeadMilliohm: { r: 1.2, x: 0.75 } };
    const byLength = { ...fixture(), bondingLeadLength: { lengthM: 15, resistanceMilliohmPerM: 0.08, reactanceMilliohmPerM: 0.05 } };
    const a = calculateBondingStudy(bondingStudySchema.parse(total));
    const b = calculateBondingStudy(bondingStudySchema.parse(byLength));
    const ideal = calculateBondingStudy(bondingStudySchema.parse(fixture()));
    const worst = (r: typeof a) => r.cases.map((c) => c.points.map((p) => p.sheathEnds.map((e) => e.voltageV)));
    for (let k = 0; k < a.cases.length; k++) {
      a.cases[k].points.forEach((p, i) => p.sheathEnds.forEach((e, j) => expect(b.cases[k].points[i].sheathEnds[j].voltageV).toBeCloseTo(e.voltageV, 9)));
    }
    // The lead impedance does act: the result differs from ideal leads.
    expect(worst(a)).not.toEqual(worst(ideal));
  });

  it('the derived resistance reaches the network: a longer lead changes the fault voltages', () => {
    const at = (lengthM: number) => calculateBondingStudy(bondingStudySchema.parse({ ...fixture(), bondingLeads: { crossSectionMm2: 240 }, bondingLeadLength: { lengthM } }));
    const fe = (r: ReturnType<typeof at>) => r.cases.find((c) => c.caseId === 'F3')!.bondingLeadCurrents.map((l) => l.maxA);
    expect(fe(at(2))).not.toEqual(fe(at(40)));
  });

  it('refuses, by field, a total and a length together, and a length with nothing to take the resistance from', () => {
    expect(issuesOf({ ...fixture(), bondingLeadMilliohm: { r: 1, x: 0 }, bondingLeadLength: { lengthM: 10, resistanceMilliohmPerM: 0.1 } })).toEqual([
      { path: 'bondingLeadMilliohm', message: expect.stringContaining('either as a total or by length, not both') },
    ]);
    expect(issuesOf({ ...fixture(), bondingLeadLength: { lengthM: 10 } })).toEqual([
      { path: 'bondingLeadLength.resistanceMilliohmPerM', message: expect.stringContaining("leads' cross-section and material") },
    ]);
    expect(issuesOf({ ...fixture(), bondingLeadLength: { lengthM: 0 } })[0]).toMatchObject({ path: 'bondingLeadLength.lengthM', message: 'Bonding lead length must be greater than zero.' });
    expect(issuesOf({ ...fixture(), bondingLeads: { crossSectionMm2: 185, material: 'aluminium' }, bondingLeadLength: { lengthM: 10 } })).toEqual([]);
  });

  it('without either, the total stays 0 + j0 mΩ as before', () => {
    expect(bondingStudySchema.parse(fixture()).bondingLeadMilliohm).toEqual({ r: 0, x: 0 });
    expect('bondingLeadMilliohm' in bondingStudySchema.parse({ ...fixture(), bondingLeadLength: { lengthM: 3, resistanceMilliohmPerM: 0.1 } })).toBe(false);
  });
});
