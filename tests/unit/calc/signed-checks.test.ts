import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { evaluateBondingCompliance } from '../../../src/lib/calc/compliance';
import { adiabaticCrossSectionMm2, adiabaticCurrentA } from '../../../src/lib/calc/adiabatic';
import { referenceStudy, relativeError, sections } from '../../helpers/reference-study';
import { decimals, referenceValues } from '../../helpers/validation';

// Issue 10 §5: the checks an engineer signs for, and the hand-check quantities, each against a
// value worked by hand in the comment beside it.

const noLimits = { name: 'none', version: 1, limits: {} };

describe('hand-check quantities', () => {
  it('the per-km impedance matrix: a sheath self term by hand (Carson, IEEE Std 367; Kersting ch. 4)', () => {
    // Rs = 0.1 Ω/km; earth-return resistance π²·f·1e-4 = 0.049348 Ω/km; De = 658.5·√(100/50) =
    // 931.26 m; X = 2π·50·2e-4·ln(931.26/0.05) = 0.617780 Ω/km.
    const m = calculateBondingStudy(referenceStudy()).impedanceMatrices[0];
    expect(m.conductors.slice(0, 3)).toEqual(['sheath C1-a', 'sheath C1-b', 'sheath C1-c']);
    const [re, im] = m.impedanceOhmPerKm[0][0];
    expect(relativeError(re, 0.149348)).toBeLessThan(1e-5);
    expect(relativeError(im, 0.617780)).toBeLessThan(1e-5);
    expect(m.conductors).toHaveLength(6);
  });

  it('induced EMF per kA: 49.540 V/km in trefoil at s = 0.110 m (methods.md SV-1, trefoil closed form)', ({ task }) => {
    const check = referenceValues(task, 'SV-1', 'docs/methods.md §4.1; derived: trefoil closed form');
    const hc = calculateBondingStudy(referenceStudy()).cases[0].handCheck;
    expect(hc.referenceCurrentA).toBe(1000);
    hc.emfVPerKmPerKA.forEach((e) => check(`hand-check EMF per kA, ${e.cable} (results)`, e.value, 49.54, 'V/km', decimals(2)));
  });

  it('sheath current per kA, solid bonding in trefoil: 1000·X/√(Rs² + X²) = 443.91 A/kA within 0.1 % (IEC 60287-1-1 §2.3.1)', () => {
    const hc = calculateBondingStudy(referenceStudy({ currentA: 800, bonding: [{ kind: 'solid', sectionIds: ['S1'] }] })).cases[0].handCheck;
    hc.sheathCurrentAPerKA.forEach((s) => expect(relativeError(s.value, 443.915)).toBeLessThan(1e-3));
  });
});

describe('adiabatic sizing of ECCs and bonding leads (IEC 60949:1988 eq. 1)', () => {
  it('copper 300 mm², 1 s, 50 → 160 °C: 226·300·√ln(394.5/284.5) = 38 764 A, and back to 300 mm²', () => {
    expect(relativeError(adiabaticCurrentA('copper', 300, 1, 50, 160), 38763.93)).toBeLessThan(1e-6);
    expect(relativeError(adiabaticCrossSectionMm2('copper', 38763.93, 1, 50, 160), 300)).toBeLessThan(1e-6);
    // Four times the duration halves the current (I ∝ 1/√t).
    expect(relativeError(adiabaticCurrentA('copper', 300, 4, 50, 160), 38763.93 / 2)).toBeLessThan(1e-6);
  });

  it('the ECC of the demo route: an item per fault case that fails when the ECC is too small', () => {
    const input = JSON.parse(readFileSync('tests/fixtures/studies/kestrel-single-point-ecc.json', 'utf8'));
    const check = (crossSectionMm2: number) => {
      input.eccs[0].crossSectionMm2 = crossSectionMm2;
      const study = bondingStudySchema.parse(input);
      const results = calculateBondingStudy(study);
      const item = evaluateBondingCompliance(study, results, noLimits).find((i) => i.criterion === 'ecc-thermal' && i.caseId === 'FE')!;
      expect(item.value).toBe(results.cases.find((c) => c.caseId === 'FE')!.eccCurrents[0].maxA);
      expect(relativeError(item.limit!, adiabaticCurrentA('copper', crossSectionMm2, 1, 50, 160))).toBeLessThan(1e-12);
      return item.status;
    };
    expect(check(1000)).toBe('pass');
    expect(check(10)).toBe('fail');
  });

  it('cross-bonding leads: their current is the sheath current arriving at the box', () => {
    const study = referenceStudy({
      sections: sections(450, 500, 560),
      bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }],
      bondingLeads: { crossSectionMm2: 35, material: 'copper' },
      cases: [{ id: 'F3', name: 'f3', kind: 'three-phase-fault', durationS: 1, currents: [{ circuitId: 'C1', currentA: 30000 }] }],
    });
    const results = calculateBondingStudy(study);
    const c = results.cases[0];
    expect(c.bondingLeadCurrents.map((l) => l.jointIndex)).toEqual([1, 2]);
    const sheathIntoJoint1 = Math.max(...c.sheathCurrents.map((s) => s.perSegment[0].currentA));
    expect(c.bondingLeadCurrents[0].maxA).toBe(sheathIntoJoint1);
    const item = evaluateBondingCompliance(study, results, noLimits).find((i) => i.criterion === 'bonding-lead-thermal')!;
    expect(relativeError(item.limit!, 226 * 35 * Math.sqrt(Math.log(394.5 / 284.5)))).toBeLessThan(1e-12);
  });
});

describe('touch voltage at link boxes and route ends (IEEE Std 80-2013 §8.3)', () => {
  it("the demo route's earth fault: an open sheath end at the station against 136.88 V (50 kg, 1 s, 120 Ω·m: (1000 + 1.5·120)·0.116/√1)", () => {
    const study = bondingStudySchema.parse(JSON.parse(readFileSync('tests/fixtures/studies/kestrel-single-point-ecc.json', 'utf8')));
    const results = calculateBondingStudy(study);
    const touch = evaluateBondingCompliance(study, results, noLimits).find((i) => i.criterion === 'touch-voltage-fault' && i.caseId === 'FE')!;
    expect(touch.limit).toBeCloseTo(136.88, 6);
    const start = results.cases.find((c) => c.caseId === 'FE')!.points[0];
    expect(touch.value).toBe(Math.max(...start.sheathEnds.map((e) => e.toLocalEarthV!)));
    expect(touch.where).toContain('to the station earth');
    expect(touch.status).toBe('fail');
  });

  it('a conducting SVL raises its link-box electrode, and that rise is the touch figure there; crushed rock raises the limit', () => {
    const input = {
      sections: sections(480, 510, 530),
      bonding: [{ kind: 'cross-bonded' as const, sectionIds: ['S1', 'S2', 'S3'] }],
      svls: [{ jointIndex: 1, connection: 'to-earth' as const, continuousRatingV: 3000, tovRatingV: 6000 }],
      cases: [{ id: 'FE', name: 'fe', kind: 'earth-fault' as const, durationS: 0.5, svlsConducting: true, earthFault: { circuitId: 'C1', phase: 'a' as const, currentA: 20000 } }],
    };
    const plain = referenceStudy(input);
    const results = calculateBondingStudy(plain);
    const box = results.cases[0].points.find((p) => p.jointIndex === 1)!;
    const item = (s: typeof plain) => evaluateBondingCompliance(s, results, noLimits).find((i) => i.criterion === 'touch-voltage-fault')!;
    expect(item(plain).value).toBeGreaterThanOrEqual(box.localEarth!.voltageV);
    // Cs = 1 − 0.09·(1 − 100/3000)/(2·0.1 + 0.09) = 0.70000; E = (1000 + 1.5·0.7·3000)·0.116/√0.5.
    const rock = referenceStudy({ ...input, touch: { bodyWeightKg: 50, surfaceLayer: { resistivityOhmM: 3000, thicknessM: 0.1 } } });
    expect(relativeError(item(rock).limit!, (1000 + 1.5 * 0.7 * 3000) * (0.116 / Math.sqrt(0.5)))).toBeLessThan(1e-4);
  });
});

describe('SVL energy and the rating effect of λ1', () => {
  it('the energy estimate of a conducting SVL is V·I·t, against its rating when given', () => {
    const study = referenceStudy({
      sections: sections(480, 510, 530),
      bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }],
      svls: [{ jointIndex: 1, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000, energyRatingKJ: 50 }],
      cases: [{ id: 'FE', name: 'fe', kind: 'earth-fault', durationS: 0.5, svlsConducting: true, earthFault: { circuitId: 'C1', phase: 'a', currentA: 20000 } }],
    });
    const results = calculateBondingStudy(study);
    const item = evaluateBondingCompliance(study, results, noLimits).find((i) => i.criterion === 'svl-energy')!;
    const worst = Math.max(...results.cases[0].svls.map((s) => (s.voltageV * s.currentA * 0.5) / 1000));
    expect(worst).toBeGreaterThan(0);
    expect(item.value).toBe(worst);
    expect(item.limit).toBe(50);
  });

  it('λ1 against the rating assumption, with the rating ratio √((1 + λ assumed)/(1 + λ1)) (IEC 60287-1-1 eq. 1, T1 and dielectric loss neglected)', () => {
    const input = { bonding: [{ kind: 'solid' as const, sectionIds: ['S1'] }] };
    const study = referenceStudy(input);
    study.cableTypes[0].ratingLossFactor = 0.05;
    const results = calculateBondingStudy(study);
    const items = evaluateBondingCompliance(study, results, noLimits).filter((i) => i.criterion === 'rating-loss-factor');
    expect(items).toHaveLength(3);
    const lambda = results.cases[0].lossFactors[0].lossFactor;
    expect(items[0].value).toBe(lambda);
    expect(items[0].where).toContain(`× ${Math.sqrt(1.05 / (1 + lambda)).toFixed(4)}`);
    expect(items[0].status).toBe(lambda <= 0.05 ? 'pass' : 'fail');
  });
});
