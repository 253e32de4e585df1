import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { type BondingStudy, bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';
import { SVL_OFF_TAG, SVL_TAG, buildBondingNetwork } from '../../../src/lib/calc/bonding/network-model';
import { caseSources } from '../../../src/lib/calc/bonding/case-sources';
import { type Complex, abs, sub } from '../../../src/lib/calc/complex';
import { solvePhysicalNetworkWithMathjs, solveWithMathjs } from '../../helpers/dense-reference';
import { referenceStudy, sections } from '../../helpers/reference-study';

// Independent reference (issue 10, "Tests and figures"): mathjs, a general-purpose library,
// solves the same physical network rebuilt from its elements as added — every node unmerged,
// solid bonds as constraints, segments in impedance form, dense complex LU — and the banded
// solve must agree to 1e-8 relative at every node and in every branch, SVL and electrode.

const fixture = (name: string) => bondingStudySchema.parse(JSON.parse(readFileSync(`tests/fixtures/studies/${name}.json`, 'utf8')));

const withConducting = (study: BondingStudy): BondingStudy => ({ ...study, cases: study.cases.map((c) => ({ ...c, svlsConducting: c.kind !== 'normal' && c.kind !== 'emergency' })) });

const stationSvl = referenceStudy({
  bonding: [{ kind: 'single-point', sectionIds: ['S1'], earthedAt: 'end' }],
  svls: [{ jointIndex: 0, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 }],
  cases: [
    { id: 'N', name: 'n', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 1000 }] },
    { id: 'FE', name: 'fe', kind: 'earth-fault', durationS: 1, earthFault: { circuitId: 'C1', phase: 'a', currentA: 20000, beyond: 'start' } },
  ],
});

const noElectrodeBox = referenceStudy({
  sections: sections(480, 510, 530),
  bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }],
  earthing: { routeStartOhm: 0.5, routeEndOhm: 0.8, linkBoxOhm: 4, overrides: [{ jointIndex: 2, noElectrode: true }] },
  svls: [
    { jointIndex: 1, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 },
    { jointIndex: 2, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 },
  ],
  cases: [
    { id: 'N', name: 'n', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 1000 }] },
    { id: 'FE', name: 'fe', kind: 'earth-fault', durationS: 1, earthFault: { circuitId: 'C1', phase: 'b', currentA: 15000, beyond: 'end' } },
  ],
});

// Two cross-bonded major sections with an ECC crossed at three joints and leads given by length.
const eccCrossedLeadsByLength = referenceStudy({
  sections: sections(480, 510, 530, 500, 490, 520),
  bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }, { kind: 'cross-bonded', sectionIds: ['S4', 'S5', 'S6'] }],
  eccs: [{ id: 'E1', name: 'ecc', resistanceOhmPerKm: 0.0754, gmrMm: 8.6, fromSectionId: 'S1', toSectionId: 'S6', transposedAtJoints: [2, 3, 5] }],
  layouts: [{ id: 'L', circuits: [{ circuitId: 'C1', formation: 'trefoil', spacingM: 0.11, depthM: 1.2 }], eccs: [{ eccId: 'E1', xM: 0.4, depthM: 1.0 }] }],
  bondingLeads: { crossSectionMm2: 185, material: 'copper' },
  bondingLeadLength: { lengthM: 12, reactanceMilliohmPerM: 0.2 },
  cases: [
    { id: 'N', name: 'n', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 1000 }] },
    { id: 'FE', name: 'fe', kind: 'earth-fault', durationS: 1, earthFault: { circuitId: 'C1', phase: 'c', currentA: 18000, beyond: 'end' } },
  ],
});

const studies: Array<[string, BondingStudy]> = [
  ['ECC crossed at joints 2, 3 and 5; leads by length', eccCrossedLeadsByLength],
  ['fernhollow-cross-bonded', fixture('fernhollow-cross-bonded')],
  ['fernhollow-cross-bonded, SVLs conducting in faults', withConducting(fixture('fernhollow-cross-bonded'))],
  ['kestrel-single-point-ecc, SVLs conducting in faults', withConducting(fixture('kestrel-single-point-ecc'))],
  ['open-end SVL beside a station, conducting', withConducting(stationSvl)],
  ['cross-bonding box with no electrode, blocking', noElectrodeBox],
  ['cross-bonding box with no electrode, conducting', withConducting(noElectrodeBox)],
];

const close = (a: Complex, b: Complex, scale: number) => abs(sub(a, b)) / Math.max(scale, 1e-300);

describe('banded solve against mathjs on the same physical network', () => {
  for (const [name, study] of studies) {
    it(`${name}: every case, every node, branch, SVL and electrode`, () => {
      const model = buildBondingNetwork(study);
      let compared = 0;
      for (const c of study.cases) {
        const tags = new Set([c.svlsConducting ? SVL_TAG : SVL_OFF_TAG]);
        const network = model.builder.compile(tags);
        const sources = caseSources(study, model, c);
        const ours = network.solve(sources);
        const dense = solvePhysicalNetworkWithMathjs(model.builder, tags, sources);
        const nodes = Array.from({ length: model.builder.nodeCount }, (_, i) => i);
        const vScale = Math.max(...nodes.map((n) => abs(dense.voltage(n))));
        for (const node of nodes) {
          expect(close(ours.voltage(node), dense.voltage(node), vScale), model.builder.label(node)).toBeLessThan(1e-8);
          compared++;
        }
        model.builder.segments.forEach((_, k) => {
          const oursI = ours.segmentCurrents(k);
          const iScale = Math.max(...dense.segmentCurrents[k].map(abs), 1);
          dense.segmentCurrents[k].forEach((z, i) => expect(close(oursI[i], z, iScale)).toBeLessThan(1e-8));
        });
        // The same assembled system through mathjs's LU: a check of the banded factorisation alone.
        const sameSystem = solveWithMathjs(network, sources);
        nodes.forEach((n) => {
          const u = network.unknownOf(n);
          if (u >= 0) expect(close(ours.voltage(n), sameSystem[u], vScale)).toBeLessThan(1e-8);
        });
      }
      expect(compared).toBeGreaterThan(10);
    });
  }
});
