import { describe, expect, it } from 'vitest';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { mutualImpedanceOhmPerM } from '../../../src/lib/calc/earth-return';
import { parallelFilamentMutualH } from '../../../src/lib/calc/finite-length';
import { angularFrequency } from '../../../src/lib/calc/constants';
import { referenceStudy, relativeError, sections } from '../../helpers/reference-study';
import type { BondingStudyInput } from '../../../src/lib/schemas/bonding-study.schema';

const mixedRoute: Partial<BondingStudyInput> = {
  sections: sections(300, 470, 520, 505, 350),
  bonding: [
    { kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] },
    { kind: 'solid', sectionIds: ['S4'] },
    { kind: 'single-point', sectionIds: ['S5'], earthedAt: 'start' },
  ],
};

describe('physical properties of the network solve', () => {
  it('voltages and currents scale linearly with the phase current', () => {
    const at = (currentA: number) => calculateBondingStudy(referenceStudy({ ...mixedRoute, currentA })).cases[0];
    const one = at(400);
    const three = at(1200);
    one.profile.series.forEach((s, k) =>
      s.voltageV.forEach((v, i) => expect(three.profile.series[k].voltageV[i]!).toBeCloseTo(3 * v!, 9)),
    );
    one.sheathCurrents.forEach((s, k) => expect(relativeError(three.sheathCurrents[k].maxA, 3 * s.maxA)).toBeLessThan(1e-12));
  });

  it('reversing the route reverses the voltage profile', () => {
    const forward = calculateBondingStudy(referenceStudy(mixedRoute)).cases[0];
    const reversed = calculateBondingStudy(
      referenceStudy({
        sections: sections(350, 505, 520, 470, 300),
        bonding: [
          { kind: 'single-point', sectionIds: ['S1'], earthedAt: 'end' },
          { kind: 'solid', sectionIds: ['S2'] },
          { kind: 'cross-bonded', sectionIds: ['S3', 'S4', 'S5'] },
        ],
      }),
    ).cases[0];
    const length = forward.profile.chainageM[forward.profile.chainageM.length - 1];
    // Cross-bonding rotates the other way when walked backwards, so compare the set of the
    // three sheath voltages at each point rather than cable by cable.
    const triple = (c: typeof forward, i: number) => c.profile.series.map((s) => s.voltageV[i]!).sort((a, b) => a - b);
    const n = forward.profile.chainageM.length;
    for (let i = 0; i < n; i++) {
      const j = n - 1 - i;
      expect(reversed.profile.chainageM[j]).toBeCloseTo(length - forward.profile.chainageM[i], 9);
      triple(forward, i).forEach((v, k) => expect(triple(reversed, j)[k]).toBeCloseTo(v, 9));
    }
  });

  it('equal minor sections in trefoil leave no residual circulating current', () => {
    const r = calculateBondingStudy(referenceStudy({ sections: sections(640, 640, 640), bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }] }));
    r.cases[0].sheathCurrents.forEach((s) => expect(s.maxA).toBeLessThan(1e-9));
    r.cases[0].lossFactors.forEach((l) => expect(l.lossFactor).toBeLessThan(1e-15));
  });

  it('the per-unit-length mutual inductance is the limit of Grover\'s finite-length formula as the segments grow', () => {
    // Differences of mutual inductance at two spacings remove the earth-return depth, which the
    // finite formula does not have: per metre, 2e-7·ln(d2/d1) in the infinite form.
    const d1 = 0.11;
    const d2 = 0.25;
    const perMetre = (mutualImpedanceOhmPerM(d1, 50, 100).im - mutualImpedanceOhmPerM(d2, 50, 100).im) / angularFrequency(50);
    const errors = [1, 10, 100, 1000, 10000].map((l) => {
      const finite = (parallelFilamentMutualH(l, d1) - parallelFilamentMutualH(l, d2)) / l;
      return relativeError(finite, perMetre);
    });
    for (let k = 1; k < errors.length; k++) expect(errors[k]).toBeLessThan(errors[k - 1]);
    expect(errors[0]).toBeGreaterThan(0.05); // a 1 m segment is far from the infinite form
    expect(errors[errors.length - 1]).toBeLessThan(1e-4);
  });

  it('never returns NaN or Infinity in a result', () => {
    const r = calculateBondingStudy(referenceStudy({ ...mixedRoute, cases: [
      { id: 'N', name: 'n', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 1000 }] },
      { id: 'E', name: 'e', kind: 'earth-fault', durationS: 1, earthFault: { circuitId: 'C1', phase: 'b', currentA: 25000, beyond: 'start' } },
    ] }));
    const walk = (v: unknown): void => {
      if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
      else if (Array.isArray(v)) v.forEach(walk);
      else if (v && typeof v === 'object') Object.values(v).forEach(walk);
    };
    walk(r);
  });
});
