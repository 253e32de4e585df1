import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import demoLimits from '../../fixtures/limit-sets/demo-owner.json';
import type { LimitSet } from '../../../src/lib/schemas/limit-set.schema';
import type { BondingStudy } from '../../../src/lib/schemas/bonding-study.schema';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { appraiseBondingOptions, checkSweep, evaluateStudy, ExploreError, firstFailures, SWEEP_LIMITS, studyAt, suggestPlacement, sweepPoint, tornado, type SweepAxis } from '../../../src/lib/calc/explore';
import { bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';
import { crossBondImbalanceM, sheathReactanceOhmPerM, solidBondingLoss } from '../../../src/lib/calc/closed-form';
import { referenceStudy, relativeError, sections } from '../../helpers/reference-study';

// Design exploration core. Reference cable and currents of shared/reference/methods.md
// (tests/helpers/reference-study.ts): trefoil s = 0.110 m, d = 0.100 m, Rs = 1.0e-4 Ω/m,
// R = 3.0e-5 Ω/m, 1000 A at 50 Hz.

const limits = demoLimits as LimitSet;
const RS = 1e-4;
const RC = 3e-5;

function crossBonded(a = 500, b = 500, c = 500): BondingStudy {
  return referenceStudy({ sections: sections(a, b, c), bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }] });
}

describe('bonding options appraisal', () => {
  const appraisal = appraiseBondingOptions(crossBonded(), limits);
  const row = (key: string) => appraisal.rows.find((r) => r.key === key)!;

  it('solid bonding has the λ1 of the closed form (IEC 60287-1-1:2006 §2.3.1, trefoil, X = 2ω·1e-7·ln(2s/d))', () => {
    const x = sheathReactanceOhmPerM(50, 0.11, 0.1);
    const expected = solidBondingLoss(RS, RC, x, 1000).lossFactor;
    expect(relativeError(row('solid').figures!.lossFactor!, expected)).toBeLessThan(0.01);
    // Losses in kW/km: λ1·I²·R for three cables (λ1 is sheath loss over conductor loss, §2.3).
    expect(relativeError(row('solid').figures!.lossesKwPerKm!, (3 * expected * 1000 ** 2 * RC * 1000) / 1000)).toBeLessThan(0.01);
  });

  it('cross-bonding with equal minor sections has a far smaller λ1 than solid bonding (IEC 60287-1-1:2006 §2.3.6: no circulating current when balanced)', () => {
    expect(crossBondImbalanceM(500, 500, 500)).toBe(0);
    const solid = row('solid').figures!.lossFactor!;
    const cross = row('cross-bonded').figures!.lossFactor!;
    expect(cross).toBeLessThan(solid / 50);
    // Single-point: no circulating path in the sheaths, λ1' ≈ 0 as well (§2.3.1 applies to bonding at both ends only).
    expect(row('single-point-start').figures!.lossFactor!).toBeLessThan(solid / 50);
  });

  it('ranks the standing voltage the way E·L says: single-point end-earthed over the whole group > middle-earthed > solid ≈ 0 (SV-1: 49.540 V/km at 1000 A)', () => {
    const emfVPerKm = 49.54;
    const start = row('single-point-start').figures!.worstStandingV!;
    const middle = row('single-point-middle').figures!.worstStandingV!;
    // E·L holds without an ECC; the appraisal's ECC carries a little induced current through the
    // station earths, which adds some 5 % here, so 8 % is allowed against the closed form.
    expect(relativeError(start, emfVPerKm * 1.5)).toBeLessThan(0.08);
    // Earthing in the middle halves the open length: half the voltage (same L/2 on both sides).
    expect(relativeError(middle, start / 2)).toBeLessThan(1e-3);
    expect(row('solid').figures!.worstStandingV!).toBeLessThan(1);
  });

  it('marks the current design, counts link boxes and says why an option does not fit', () => {
    expect(row('current').isCurrent).toBe(true);
    expect(row('cross-bonded').isCurrent).toBe(true);
    expect(row('solid').isCurrent).toBe(false);
    expect(row('cross-bonded').figures!.linkBoxes).toBe(2);
    expect(row('single-point-middle').figures!.linkBoxes).toBe(1);
    expect(row('mixed').notAvailable).toMatch(/cross-bonded option covers/);
    const four = appraiseBondingOptions(referenceStudy({ sections: sections(500, 500, 500, 300), bonding: [{ kind: 'solid', sectionIds: ['S1', 'S2', 'S3', 'S4'] }] }), limits);
    expect(four.rows.find((r) => r.key === 'cross-bonded')!.notAvailable).toMatch(/4 sections, not a multiple of three/);
    expect(four.rows.find((r) => r.key === 'mixed')!.figures).toBeDefined();
  });
});

describe('sensitivity sweep', () => {
  const base = crossBonded(480, 500, 520);
  const axes: SweepAxis[] = [
    { input: { kind: 'soil-resistivity' }, fromValue: 20, toValue: 1000, points: 3 },
    { input: { kind: 'section-length', sectionId: 'S2' }, fromValue: 300, toValue: 900, points: 2 },
  ];

  it('reproduces a single calculation of the same study exactly at every grid point', () => {
    const expectedAt = [
      [20, 300], [510, 300], [1000, 300],
      [20, 900], [510, 900], [1000, 900],
    ];
    expect(checkSweep(base, axes)).toBe(6);
    expectedAt.forEach(([rho, len], index) => {
      const point = sweepPoint(base, limits, axes, index);
      expect(point.values).toEqual([rho, len]);
      const single = evaluateStudy({ ...base, soilResistivityOhmM: rho, sections: base.sections.map((s) => (s.id === 'S2' ? { ...s, lengthM: len } : s)) }, limits);
      if (!single.ok) throw new Error(single.error);
      expect(point.quantities).toEqual(single.figures.quantities);
      expect(point.worstMarginPct).toBe(single.figures.worstMarginPct);
    });
  });

  it('calculates in checks-only scope exactly the figures of a full calculation, without the extras', () => {
    const fullResults = calculateBondingStudy(base);
    const lean = calculateBondingStudy(base, 'checks');
    // Same figures everywhere the checklist reads (points, SVLs, currents, loss factors), to the bit;
    // the per-segment current table, the worst-value summary and the profile are left out.
    const figures = (r: typeof fullResults) => r.cases.map(({ profile: _p, handCheck: _h, sheathCurrents, ...rest }) => ({ ...rest, sheathCurrents: sheathCurrents.map(({ perSegment: _s, ...s }) => s) }));
    expect(figures(lean)).toEqual(figures(fullResults));
    expect(lean.cases.every((c) => c.profile.series.length === 0 && c.sheathCurrents.every((s) => s.perSegment.length === 0))).toBe(true);
    expect(lean.crossChecks).toEqual([]);
    expect(lean.worst).toEqual([]);
    expect(fullResults.cases.every((c) => c.profile.series.length > 0)).toBe(true);
    // The largest sheath current is the largest of the full table's per-segment currents.
    fullResults.cases.forEach((c) => c.sheathCurrents.forEach((s) => expect(s.maxA).toBe(Math.max(...s.perSegment.map((p) => p.currentA)))));
  });

  it('gives the same checklist in checks-only scope as in full, item for item, on a route with SVLs, faults and two major sections (demo study)', () => {
    // Fernhollow (fictional demo): cross-bonded with SVLs at the link boxes, load, emergency and fault cases.
    const study = bondingStudySchema.parse(JSON.parse(readFileSync('tests/fixtures/studies/fernhollow-cross-bonded.json', 'utf8')));
    const full = evaluateStudy(study, limits);
    const lean = evaluateStudy(study, limits, 'checks');
    if (!full.ok || !lean.ok) throw new Error('the demo study should calculate');
    expect(full.items.some((i) => i.criterion === 'svl-continuous') && full.items.some((i) => i.criterion === 'joint-voltage-fault')).toBe(true);
    expect(lean.items).toEqual(full.items);
    // And a sweep over it reproduces the full calculation at its grid points (earth resistance × fault current).
    const axes: SweepAxis[] = [
      { input: { kind: 'earth-resistance', at: 'link-boxes' }, fromValue: 2, toValue: 15, points: 2 },
      { input: { kind: 'fault-current' }, fromValue: 10000, toValue: 40000, points: 2 },
    ];
    [0, 1, 2, 3].forEach((index) => {
      const point = sweepPoint(study, limits, axes, index);
      const single = evaluateStudy(studyAt(study, axes, point.values), limits);
      if (!single.ok) throw new Error(single.error);
      expect(point.quantities).toEqual(single.figures.quantities);
      expect(point.failing).toEqual(single.figures.failing);
    });
  });

  it('finds where a check starts to fail along the load current', () => {
    const load: SweepAxis[] = [{ input: { kind: 'load-current' }, fromValue: 500, toValue: 3000, points: 6 }];
    const points = Array.from({ length: 6 }, (_, i) => sweepPoint(referenceStudy(), limits, load, i));
    // Single-point 500 m, open end E·L = 49.54 V/km × 0.5 km per kA: 65 V (demo limit) is passed near 2.6 kA.
    const first = firstFailures(points).find((f) => f.criterion === 'standing-voltage-normal')!;
    expect(first.values[0]).toBe(3000);
    expect(points[4].failing).not.toContain('standing-voltage-normal');
  });

  it('refuses a grid over the limit with a clear message, and takes one at the limit', () => {
    const big: SweepAxis[] = [
      { input: { kind: 'soil-resistivity' }, fromValue: 10, toValue: 1000, points: 50 },
      { input: { kind: 'load-current' }, fromValue: 100, toValue: 2000, points: 50 },
    ];
    expect(() => checkSweep(base, big)).toThrow(ExploreError);
    expect(() => checkSweep(base, big)).toThrow(`A sweep of 2,500 grid points is over the limit of 1,000; use fewer points.`);
    expect(checkSweep(base, [{ ...big[0], points: 200 }, { ...big[1], points: 5 }])).toBe(SWEEP_LIMITS.maxPoints);
    expect(() => checkSweep(base, [{ input: { kind: 'section-length', sectionId: 'S9' }, fromValue: 1, toValue: 2, points: 2 }])).toThrow('No section "S9" in the study.');
  });
});

describe('tornado', () => {
  it('ranks the load current above the soil resistivity for the worst margin of a single-point run (E ∝ I; ρ enters only through ln De)', () => {
    const t = tornado(referenceStudy(), limits, [
      { input: { kind: 'soil-resistivity' }, plusMinusPct: 20 },
      { input: { kind: 'load-current' }, plusMinusPct: 20 },
    ]);
    expect(t.bars.map((b) => b.input.kind)).toEqual(['load-current', 'soil-resistivity']);
    expect(t.bars[0].swingPct).toBeGreaterThan(5);
    expect(t.bars[1].swingPct).toBeLessThan(t.bars[0].swingPct / 10);
  });
});

describe('joint-bay placement', () => {
  it('with one free joint finds the equal-length optimum of the closed form (residual ∝ √(a²+b²+c²−ab−bc−ca), zero at a = b = c)', () => {
    const study = crossBonded(500, 400, 600);
    const p = suggestPlacement(study, { windows: [{ fromM: 500, toM: 500 }, { fromM: 700, toM: 1400 }], drumLengthM: 800 });
    const m = p.majorSections[0];
    expect(m.suggestedLengthsM).toEqual([500, 500, 500]);
    expect(m.suggestedImbalancePct).toBe(0);
    expect(m.currentImbalancePct).toBeCloseTo((100 * crossBondImbalanceM(500, 400, 600)) / 1500, 9);
    // The full solve agrees: the suggested joints cut λ1 and the standing voltage.
    const before = evaluateStudy(study, limits);
    const after = evaluateStudy(p.suggestedStudy!, limits);
    if (!before.ok || !after.ok) throw new Error('not solved');
    const lf = (e: typeof before) => (e.ok ? Math.max(...e.results.cases[0].lossFactors.map((l) => l.lossFactor)) : NaN);
    expect(lf(after)).toBeLessThan(lf(before) / 20);
  });

  it('respects the drum length and the windows when the optimum is forbidden, and says when nothing fits', () => {
    const study = crossBonded(500, 500, 500);
    const p = suggestPlacement(study, { windows: [{ fromM: 300, toM: 450 }, { fromM: 1100, toM: 1200 }], drumLengthM: 700 });
    const [a, b, c] = p.majorSections[0].suggestedLengthsM!;
    expect(a).toBeGreaterThanOrEqual(300 - 1e-9);
    expect(a).toBeLessThanOrEqual(450 + 1e-9);
    expect(a + b).toBeGreaterThanOrEqual(1100 - 1e-9);
    expect(Math.max(a, b, c)).toBeLessThanOrEqual(700 + 1e-9);
    expect(p.majorSections[0].currentViolations.length).toBe(2);
    const none = suggestPlacement(study, { windows: [{ fromM: 10, toM: 20 }], drumLengthM: 700 });
    expect(none.majorSections[0].reason).toMatch(/No pair of joint positions/);
    expect(none.suggestedStudy).toBeNull();
  });
});
