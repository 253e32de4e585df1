import { describe, expect, it } from 'vitest';
import { abs, argDeg, polar } from '../../../src/lib/calc/complex';
import {
  crossBondCurrentA,
  crossBondLossMultiplier,
  crossBondResidualV,
  flatMutualReactanceOhmPerM,
  flatSheathEmf,
  sectionalisingJointV,
  sheathReactanceOhmPerM,
  solidBondingLoss,
  transposedFlatReactanceOhmPerM,
  trefoilSheathEmf,
} from '../../../src/lib/calc/closed-form';
import { earthReturnDepthM, mutualImpedanceOhmPerM } from '../../../src/lib/calc/earth-return';
import { parallelFilamentMutualH, straightWireSelfH } from '../../../src/lib/calc/finite-length';
import { surfaceLayerFactor, tolerableBodyCurrentA, tolerableVoltages } from '../../../src/lib/calc/body-tolerance';
import { acCurrentDensityAPerM2 } from '../../../src/lib/calc/pipeline';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { calculateExposureStudy } from '../../../src/lib/calc/exposure/solve-exposure';
import { exposureStudySchema } from '../../../src/lib/schemas/exposure-study.schema';
import { referenceStudy, relativeError, sections } from '../../helpers/reference-study';

// Check values of shared/reference/methods.md, each with its id and tag. [derived] values
// are reproduced to 1e-6 relative with the same formula (or to the printed digits), and to
// 0.1 % with the network solve.

const balanced = (i: number) => [polar(i, 0), polar(i, -120), polar(i, 120)];
const printed = (actual: number, expected: number, digits: number) => expect(actual).toBeCloseTo(expected, digits);

describe('§1 sheath EMF per unit length', () => {
  it('SV-1: trefoil s = 0.110 m: X = 4.954024e-5 Ω/m, 49.540 V/km [derived: trefoil closed form]', () => {
    const x = sheathReactanceOhmPerM(50, 0.11, 0.1);
    expect(relativeError(x, 4.954024e-5)).toBeLessThan(1e-6);
    trefoilSheathEmf(balanced(1000), x).forEach((e) => printed(abs(e) * 1000, 49.54, 3));
  });

  it('SV-3: flat s = 0.250 m, middle cable: 101.124 V/km at −30° [derived: flat closed form]', () => {
    const [, eb] = flatSheathEmf(balanced(1000), sheathReactanceOhmPerM(50, 0.25, 0.1), flatMutualReactanceOhmPerM(50));
    printed(abs(eb) * 1000, 101.124, 3);
    printed(argDeg(eb), -30, 9);
  });

  it('SV-4: flat s = 0.250 m, outer cables: 128.557 V/km [derived: flat closed form; direct sum agrees]', () => {
    const [ea, , ec] = flatSheathEmf(balanced(1000), sheathReactanceOhmPerM(50, 0.25, 0.1), flatMutualReactanceOhmPerM(50));
    printed(abs(ea) * 1000, 128.557, 3);
    printed(abs(ec) * 1000, 128.557, 3);
  });

  it('SV-6: SV-1, SV-3, SV-4 at 60 Hz: 59.448 / 121.349 / 154.269 V/km [derived]', () => {
    const x = sheathReactanceOhmPerM(60, 0.11, 0.1);
    printed(abs(trefoilSheathEmf(balanced(1000), x)[0]) * 1000, 59.448, 3);
    const [ea, eb] = flatSheathEmf(balanced(1000), sheathReactanceOhmPerM(60, 0.25, 0.1), flatMutualReactanceOhmPerM(60));
    printed(abs(eb) * 1000, 121.349, 3);
    printed(abs(ea) * 1000, 154.269, 3);
  });

  it('SV-7: single-point bonded 500 m, open end: trefoil 24.770 V, flat outer 64.279 V, middle 50.562 V [derived: V = E·L], by the network solve', () => {
    const open = (formation: 'trefoil' | 'flat') => {
      const r = calculateBondingStudy(referenceStudy({ formation }));
      return r.cases[0].points.find((p) => p.chainageM === 500)!.sheathEnds.map((e) => e.voltageV);
    };
    open('trefoil').forEach((v) => expect(relativeError(v, 24.77)).toBeLessThan(1e-3));
    const [a, b, c] = open('flat');
    expect(relativeError(a, 64.279)).toBeLessThan(1e-3);
    expect(relativeError(b, 50.562)).toBeLessThan(1e-3);
    expect(relativeError(c, 64.279)).toBeLessThan(1e-3);
  });

  it("LF-1: trefoil, both ends bonded: λ1' = 0.656868, Is = 443.915 A [derived: IEC trefoil formula; a circuit solve agrees]", () => {
    const closed = solidBondingLoss(1e-4, 3e-5, sheathReactanceOhmPerM(50, 0.11, 0.1), 1000);
    printed(closed.lossFactor, 0.656868, 6);
    printed(closed.sheathCurrentA, 443.915, 3);
    const r = calculateBondingStudy(referenceStudy({ bonding: [{ kind: 'solid', sectionIds: ['S1'] }] }));
    r.cases[0].lossFactors.forEach((l) => expect(relativeError(l.lossFactor, 0.656868)).toBeLessThan(1e-3));
    r.cases[0].sheathCurrents.forEach((s) => expect(relativeError(s.maxA, 443.915)).toBeLessThan(1e-3));
  });

  it("LF-3: flat s = 0.250, regularly transposed: X1 = 1.156412e-4 Ω/m, λ1' = 1.907180 [derived: IEC transposed formula]", () => {
    const x1 = transposedFlatReactanceOhmPerM(50, 0.25, 0.1);
    expect(relativeError(x1, 1.156412e-4)).toBeLessThan(1e-6);
    printed(solidBondingLoss(1e-4, 3e-5, x1, 1000).lossFactor, 1.90718, 6);
  });
});

describe('§2 cross-bonding', () => {
  const x = sheathReactanceOhmPerM(50, 0.11, 0.1);
  const e = x * 1000;
  const crossBonded = (a: number, b: number, c: number, currentA = 1000, kind: 'normal' | 'three-phase-fault' = 'normal') =>
    calculateBondingStudy(
      referenceStudy({
        sections: sections(a, b, c),
        bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }],
        cases: [{ id: 'K', name: 'k', kind, durationS: 1, currents: [{ circuitId: 'C1', currentA }] }],
      }),
    ).cases[0];

  it('XB-1: minors 480/500/520 m: E_res = 1.7161 V, Is = 10.252 A, multiplier 5.3333e-4 [derived: §2 formula; a circuit solve agrees]', () => {
    printed(crossBondResidualV(e, 480, 500, 520), 1.7161, 4);
    printed(crossBondCurrentA(e, 480, 500, 520, 1e-4, x), 10.252, 3);
    expect(relativeError(crossBondLossMultiplier(480, 500, 520), 5.3333e-4)).toBeLessThan(1e-4);
    crossBonded(480, 500, 520).sheathCurrents.forEach((s) => expect(relativeError(s.maxA, 10.252)).toBeLessThan(1e-3));
  });

  it('XB-2: equal 500 m minors: E_res = 0, Is = 0 [derived]', () => {
    expect(crossBondResidualV(e, 500, 500, 500)).toBe(0);
    crossBonded(500, 500, 500).sheathCurrents.forEach((s) => expect(s.maxA).toBeLessThan(1e-9));
  });

  it('XB-3: minors 400/500/600 m: E_res = 8.5806 V, Is = 51.259 A, multiplier 0.013333 [derived]', () => {
    printed(crossBondResidualV(e, 400, 500, 600), 8.5806, 4);
    printed(crossBondCurrentA(e, 400, 500, 600, 1e-4, x), 51.259, 3);
    printed(crossBondLossMultiplier(400, 500, 600), 0.013333, 6);
    crossBonded(400, 500, 600).sheathCurrents.forEach((s) => expect(relativeError(s.maxA, 51.259)).toBeLessThan(1e-3));
  });

  it('XB-7: three-phase through fault 31.5 kA, equal 500 m minors: 780.26 V at the link box, 1351.45 V across the joint [derived: E·I_f·L, √3]', () => {
    printed(e * 31.5 * 500, 780.26, 2);
    printed(sectionalisingJointV(780.26), 1351.45, 1);
    const fault = crossBonded(500, 500, 500, 31500, 'three-phase-fault');
    const box = fault.points.find((p) => p.jointIndex === 1)!;
    box.sheathEnds.forEach((s) => expect(relativeError(s.voltageV, 780.26)).toBeLessThan(1e-3));
    box.acrossJoint.forEach((a) => expect(relativeError(a.voltageV, 1351.45)).toBeLessThan(1e-3));
  });
});

describe('§3 earth return (Carson, simplified, 658.5)', () => {
  it('CR-1: ρ = 100 Ω·m, 50 Hz: De = 931.26 m [derived, 658.5]', () => printed(earthReturnDepthM(100, 50), 931.26, 2));
  it('CR-2: ρ = 100 Ω·m, 60 Hz: De = 850.12 m [derived, 658.5]', () => printed(earthReturnDepthM(100, 60), 850.12, 2));
  it('CR-4: D = 1 m: Zm = 0.049348 + j0.429552 Ω/km [derived]', () => {
    const z = mutualImpedanceOhmPerM(1, 50, 100);
    printed(z.re * 1000, 0.049348, 6);
    printed(z.im * 1000, 0.429552, 6);
  });
  it('CR-5: D = 10 m: Zm = 0.049348 + j0.284877 Ω/km [derived]', () => {
    const z = mutualImpedanceOhmPerM(10, 50, 100);
    printed(z.re * 1000, 0.049348, 6);
    printed(z.im * 1000, 0.284877, 6);
  });
  it('TC-1: 5 km of metallic line at 50 m, 10 kA earth-return fault current: EMF = 9513 V [derived: E = |Zm|·L·I], by the exposure solve', () => {
    const study = exposureStudySchema.parse({
      kind: 'exposure',
      title: 'TC-1',
      frequencyHz: 50,
      soilResistivityOhmM: 100,
      sources: [{ id: 'line', xM: 0, yM: 10 }],
      object: { name: 'line', type: 'telecom-cable', xM: 50, yM: 10, parallelLengthM: 5000, resistanceOhmPerKm: 10, gmrMm: 1, earthing: 'start' },
      cases: [{ id: 'F', name: 'fault', kind: 'fault', durationS: 0.5, currents: [{ sourceId: 'line', currentA: 10000 }] }],
    });
    const [fault] = calculateExposureStudy(study).cases;
    expect(Math.round(fault.emfV)).toBe(9513);
    // One end earthed: no current, so the open end stands at the full EMF.
    expect(relativeError(fault.endV, fault.emfV)).toBeLessThan(1e-9);
  });
});

describe('§4 finite straight conductors (Grover, Rosa)', () => {
  it('GR-1: l = 1 m, d = 0.1 m: M = 4.186471e-7 H [derived: Grover M]', () => expect(relativeError(parallelFilamentMutualH(1, 0.1), 4.186471e-7)).toBeLessThan(1e-6));
  it('GR-3: l = 1 m, d = 0.01 m: M = 8.616585e-7 H [derived]', () => expect(relativeError(parallelFilamentMutualH(1, 0.01), 8.616585e-7)).toBeLessThan(1e-6));
  it('GR-6: l = 1 m, r = 1 mm: L = 1.370180e-6 H [derived: Rosa self inductance]', () => expect(relativeError(straightWireSelfH(1, 0.001), 1.37018e-6)).toBeLessThan(1e-6));
});

describe('§6 tolerable touch and step voltage (IEEE Std 80-2013)', () => {
  it('GD-1: ρ = 400, ρs = 2500, hs = 0.102 m: Cs = 0.742857 [derived; IEEE 80 Annex B inputs, from memory]', () => printed(surfaceLayerFactor(400, 2500, 0.102), 0.742857, 6));
  it('GD-2: Cs = 0.74, ρs = 2500, ts = 0.5 s, 70 kg: touch 838.2 V, step 2686.6 V [published, from memory: IEEE 80 Annex B; derived]', () => {
    const ib = tolerableBodyCurrentA(0.5, 70);
    printed((1000 + 1.5 * 0.74 * 2500) * ib, 838.2, 1);
    printed((1000 + 6 * 0.74 * 2500) * ib, 2686.6, 1);
  });
  it('GD-4: no surface layer, ρ = 100, ts = 0.5 s, 50 kg: touch 188.66 V, step 262.48 V [derived]', () => {
    const v = tolerableVoltages({ soilResistivityOhmM: 100, durationS: 0.5, bodyWeightKg: 50 });
    printed(v.touchV, 188.66, 2);
    printed(v.stepV, 262.48, 2);
  });
  it('GD-12: tolerable body current 50 kg at 0.5 / 1.0 / 3.0 s: 0.16405 / 0.116 / 0.06697 A [derived]', () => {
    printed(tolerableBodyCurrentA(0.5, 50), 0.16405, 5);
    printed(tolerableBodyCurrentA(1, 50), 0.116, 5);
    printed(tolerableBodyCurrentA(3, 50), 0.06697, 5);
  });
});

describe('§7 pipelines', () => {
  it('PL-1: 15 V, ρ = 100 Ω·m, 1 cm² defect (d = 0.0112838 m): J = 33.85 A/m² [derived]', () => printed(acCurrentDensityAPerM2(15, 100, 0.0112838), 33.85, 2));
});
