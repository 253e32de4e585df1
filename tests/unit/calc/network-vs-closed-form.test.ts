import { describe, expect, it } from 'vitest';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { referenceStudy, sections } from '../../helpers/reference-study';

// The network solve against the closed forms it reports beside itself (IEC 60287-1-1:2006
// §2.3, IEEE Std 575, CIGRE TB 283): single-point, solid and cross-bonded, trefoil and flat,
// within 0.1 %. Earth resistances are made very large where the closed form assumes the
// sheaths bonded only to each other (no earth-return path for a common-mode current).

const isolatedEarthing = { routeStartOhm: 1e6, routeEndOhm: 1e6, linkBoxOhm: 1e6 };

function crossChecks(study: ReturnType<typeof referenceStudy>) {
  const checks = calculateBondingStudy(study).crossChecks;
  expect(checks.length).toBeGreaterThan(0);
  return checks;
}

describe('network solve agrees with the closed forms within 0.1 %', () => {
  const cases: Array<[string, ReturnType<typeof referenceStudy>, number]> = [
    ['single-point trefoil, earthed at the start', referenceStudy(), 3],
    ['single-point flat, earthed at the end', referenceStudy({ formation: 'flat', bonding: [{ kind: 'single-point', sectionIds: ['S1'], earthedAt: 'end' }] }), 3],
    ['single-point flat, earthed in the middle', referenceStudy({ formation: 'flat', bonding: [{ kind: 'single-point', sectionIds: ['S1'], earthedAt: 'middle' }] }), 6],
    ['solid trefoil', referenceStudy({ bonding: [{ kind: 'solid', sectionIds: ['S1'] }] }), 6],
    [
      'solid flat, not transposed (IEC P, Q formulas)',
      referenceStudy({ formation: 'flat', earthing: isolatedEarthing, bonding: [{ kind: 'solid', sectionIds: ['S1'] }] }),
      3,
    ],
    [
      'solid flat, regularly transposed (X1)',
      referenceStudy({
        formation: 'flat',
        earthing: isolatedEarthing,
        sections: [
          { id: 'S1', lengthM: 400, layoutId: 'L', phaseRotation: 0 },
          { id: 'S2', lengthM: 400, layoutId: 'L', phaseRotation: 1 },
          { id: 'S3', lengthM: 400, layoutId: 'L', phaseRotation: 2 },
        ],
        bonding: [{ kind: 'solid', sectionIds: ['S1', 'S2', 'S3'] }],
      }),
      3,
    ],
    [
      'cross-bonded trefoil, unequal minors',
      referenceStudy({ sections: sections(430, 515, 560), bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }] }),
      3,
    ],
  ];

  for (const [name, study, count] of cases) {
    it(name, () => {
      const checks = crossChecks(study);
      expect(checks).toHaveLength(count);
      for (const c of checks) expect(Math.abs(c.differencePct), c.description).toBeLessThan(0.1);
    });
  }

  it('reports, rather than hides, a difference where an ECC changes the physics', () => {
    const withEcc = referenceStudy({
      formation: 'flat',
      eccs: [{ id: 'E', name: 'ecc', resistanceOhmPerKm: 0.06, gmrMm: 8, fromSectionId: 'S1', toSectionId: 'S1' }],
      layouts: [{ id: 'L', circuits: [{ circuitId: 'C1', formation: 'flat', spacingM: 0.25, depthM: 1.2 }], eccs: [{ eccId: 'E', xM: 0.6, depthM: 1.2 }] }],
    });
    // The closed form does not apply with an ECC beside the cables, so none is reported.
    expect(calculateBondingStudy(withEcc).crossChecks).toHaveLength(0);
  });
});
