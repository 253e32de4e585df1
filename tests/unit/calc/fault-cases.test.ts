import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { bondingStudySchema, type BondingStudy, type BondingStudyInput } from '../../../src/lib/schemas/bonding-study.schema';
import { describeIssues } from '../../../src/lib/schemas/study.schema';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { SVL_OFF_TAG, SVL_TAG, buildBondingNetwork } from '../../../src/lib/calc/bonding/network-model';
import { caseSegmentSources, caseSources } from '../../../src/lib/calc/bonding/case-sources';
import { type Complex, abs, add, polar, sub, ZERO } from '../../../src/lib/calc/complex';
import type { CaseResult } from '../../../src/lib/calc/bonding/results';
import { solvePhysicalNetworkWithMathjs } from '../../helpers/dense-reference';
import { referenceStudy, referenceStudyInput, relativeError, sections } from '../../helpers/reference-study';

// Issue 10 §3: fault cases. References: mathjs on the same physical network (independent
// assembly), Kirchhoff's current law at the fault point and over all electrodes, Ohm's law at
// an isolated station grid, superposition (the network is linear), and mirror symmetry.

const phasor = (m: number, deg: number) => polar(m, deg);
const electrodeCurrent = (p: CaseResult['points'][number]): Complex =>
  p.localEarth && p.localEarth.resistanceOhm !== null ? phasor(p.localEarth.voltageV / p.localEarth.resistanceOhm, p.localEarth.angleDeg) : ZERO;
const sumElectrodes = (c: CaseResult) => c.points.reduce((s, p) => add(s, electrodeCurrent(p)), ZERO);

const solidRoute = (cases: BondingStudyInput['cases'], extra: Partial<BondingStudyInput> = {}) =>
  referenceStudy({
    sections: sections(500, 520, 480),
    bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }],
    earthing: { routeStartOhm: 0.3, routeEndOhm: 0.5, linkBoxOhm: 5 },
    cases,
    ...extra,
  });

const internalAt = (place: { jointIndex?: number; chainageM?: number }, fromStart: number, fromEnd: number) => ({
  id: 'IF',
  name: 'internal fault',
  kind: 'internal-fault' as const,
  durationS: 0.5,
  internalFault: { circuitId: 'C1', phase: 'b' as const, ...place, fromStart: { currentA: fromStart }, fromEnd: { currentA: fromEnd, angleDeg: -10 } },
});

function againstMathjs(study: BondingStudy) {
  const model = buildBondingNetwork(study);
  for (const c of study.cases) {
    const tags = new Set([c.svlsConducting ? SVL_TAG : SVL_OFF_TAG]);
    const sources = caseSources(study, model, c);
    const segmentSources = caseSegmentSources(study, model, c, sources);
    const ours = model.builder.compile(tags).solve(sources, segmentSources);
    const dense = solvePhysicalNetworkWithMathjs(model.builder, tags, sources, segmentSources);
    const nodes = Array.from({ length: model.builder.nodeCount }, (_, i) => i);
    const scale = Math.max(...nodes.map((n) => abs(dense.voltage(n))));
    expect(scale).toBeGreaterThan(1);
    nodes.forEach((n) => expect(abs(sub(ours.voltage(n), dense.voltage(n))) / scale, model.builder.label(n)).toBeLessThan(1e-8));
    model.builder.segments.forEach((_, k) => {
      const mine = ours.segmentCurrents(k);
      const iScale = Math.max(...dense.segmentCurrents[k].map(abs), 1);
      dense.segmentCurrents[k].forEach((z, i) => expect(abs(sub(mine[i], z)) / iScale).toBeLessThan(1e-8));
    });
  }
}

describe('internal fault: core-to-sheath breakdown on the route', () => {
  it('at a chainage inside a section, fed from both ends: agrees with mathjs on the same network (per-segment core currents)', () => {
    againstMathjs(solidRoute([internalAt({ chainageM: 730 }, 12000, 7000)]));
  });

  it('at a cross-bonding joint with SVLs conducting: agrees with mathjs', () => {
    const study = solidRoute([{ ...internalAt({ jointIndex: 2 }, 15000, 0), svlsConducting: true }], {
      svls: [1, 2].map((jointIndex) => ({ jointIndex, connection: 'to-earth' as const, continuousRatingV: 3000, tovRatingV: 6000 })),
    });
    againstMathjs(study);
  });

  it("the fault current enters the faulted sheath at the fault point (Kirchhoff's current law)", () => {
    const study = solidRoute([internalAt({ chainageM: 730 }, 12000, 7000)]);
    const r = calculateBondingStudy(study).cases[0];
    const model = buildBondingNetwork(study);
    const c = study.cases[0];
    const sources = caseSources(study, model, c);
    const solution = model.builder.compile(new Set([SVL_OFF_TAG])).solve(sources, caseSegmentSources(study, model, c, sources));
    const fault = model.internalFaults.get('IF')!;
    const before = solution.segmentCurrents(fault.joint - 1)[fault.cable];
    const after = solution.segmentCurrents(fault.joint)[fault.cable];
    const infeed = add(phasor(12000, 0), phasor(7000, -10));
    expect(abs(sub(sub(after, before), infeed)) / abs(infeed)).toBeLessThan(1e-9);
    // Each infeed returns to its own station: the electrodes together pass no net current.
    expect(abs(sumElectrodes(r)) / abs(infeed)).toBeLessThan(1e-9);
    expect(r.kind).toBe('internal-fault');
    expect(Math.max(...r.points.map((p) => p.maxV))).toBeGreaterThan(100);
  });

  it('mirror symmetry: fed from the start at x equals fed from the end at L − x on the reversed route', () => {
    const forward = calculateBondingStudy(referenceStudy({
      sections: sections(400, 600), bonding: [{ kind: 'solid', sectionIds: ['S1', 'S2'] }],
      earthing: { routeStartOhm: 0.4, routeEndOhm: 0.9, linkBoxOhm: 5 },
      cases: [{ id: 'IF', name: 'i', kind: 'internal-fault', durationS: 0.5, internalFault: { circuitId: 'C1', phase: 'a', chainageM: 250, fromStart: { currentA: 10000 } } }],
    })).cases[0];
    const reversed = calculateBondingStudy(referenceStudy({
      sections: sections(600, 400), bonding: [{ kind: 'solid', sectionIds: ['S1', 'S2'] }],
      earthing: { routeStartOhm: 0.9, routeEndOhm: 0.4, linkBoxOhm: 5 },
      cases: [{ id: 'IF', name: 'i', kind: 'internal-fault', durationS: 0.5, internalFault: { circuitId: 'C1', phase: 'a', chainageM: 750, fromEnd: { currentA: 10000 } } }],
    })).cases[0];
    const ends = (c: CaseResult) => [c.points[0].localEarth!.voltageV, c.points[c.points.length - 1].localEarth!.voltageV];
    const [fs, fe] = ends(forward);
    const [rs, re] = ends(reversed);
    expect(relativeError(re, fs)).toBeLessThan(1e-9);
    expect(relativeError(rs, fe)).toBeLessThan(1e-9);
  });

  it('refuses a fault placed both at a joint and a chainage, beyond the route, or with no infeed', () => {
    const issues = (f: Record<string, unknown>) => {
      const parsed = bondingStudySchema.safeParse(referenceStudyInput({ cases: [{ id: 'IF', name: 'i', kind: 'internal-fault', durationS: 1, internalFault: { circuitId: 'C1', phase: 'a', ...f } as never }] }));
      expect(parsed.success).toBe(false);
      return parsed.success ? [] : describeIssues(parsed.error);
    };
    expect(issues({ jointIndex: 1, chainageM: 100, fromStart: { currentA: 1000 } })[0].field).toBe('cases.0.internalFault.jointIndex');
    expect(issues({ chainageM: 900, fromStart: { currentA: 1000 } })).toContainEqual({ field: 'cases.0.internalFault.chainageM', message: expect.stringContaining('beyond the route end') });
    expect(issues({ jointIndex: 1 })).toContainEqual({ field: 'cases.0.internalFault.fromStart', message: expect.stringContaining('Give the infeed') });
  });
});

describe('through faults', () => {
  it('phase-to-phase-to-earth is the superposition of its two phase currents (the network is linear)', () => {
    const ppe = { id: 'PPE', name: 'b-c-earth', kind: 'phase-phase-earth-fault' as const, durationS: 1, phasePhaseEarthFault: { circuitId: 'C1', phases: ['b', 'c'] as ['b', 'c'], currents: [{ currentA: 9000, angleDeg: 0 }, { currentA: 6000, angleDeg: 0 }] as [{ currentA: number; angleDeg: number }, { currentA: number; angleDeg: number }] } };
    const ef = (id: string, phase: 'b' | 'c', currentA: number) => ({ id, name: id, kind: 'earth-fault' as const, durationS: 1, earthFault: { circuitId: 'C1', phase, currentA } });
    const study = solidRoute([ppe, ef('FB', 'b', 9000), ef('FC', 'c', 6000)]);
    const model = buildBondingNetwork(study);
    const network = model.builder.compile(new Set([SVL_OFF_TAG]));
    const [both, b, c] = study.cases.map((k) => network.solve(caseSources(study, model, k)));
    for (let n = 0; n < model.builder.nodeCount; n++) {
      const sum = add(b.voltage(n), c.voltage(n));
      expect(abs(sub(both.voltage(n), sum))).toBeLessThan(1e-9 * Math.max(1, abs(sum)));
    }
    // With angles, the earth takes the phasor sum of the two phase currents (hand: 9 kA∠−120° + 6 kA∠120°).
    const angled = solidRoute([{ ...ppe, phasePhaseEarthFault: { ...ppe.phasePhaseEarthFault, currents: [{ currentA: 9000, angleDeg: -120 }, { currentA: 6000, angleDeg: 120 }] } }]);
    const m2 = buildBondingNetwork(angled);
    const s = caseSources(angled, m2, angled.cases[0]);
    expect(abs(sub(s[m2.earthAtEndIndex], add(phasor(9000, -120), phasor(6000, 120))))).toBeLessThan(1e-9);
    againstMathjs(angled);
  });

  it('an earth fault returning only partly through the source-end station: the electrodes pass the rest to remote earth', () => {
    const study = solidRoute([0, 0.6, 1].map((share) => ({ id: `FE${share}`, name: 'fe', kind: 'earth-fault' as const, durationS: 1, earthFault: { circuitId: 'C1', phase: 'a' as const, currentA: 20000, sourceStationShare: share } })));
    const r = calculateBondingStudy(study);
    [0, 0.6, 1].forEach((share, k) => {
      // Σ electrode currents = injected − drawn back = 20 kA·(1 − share) (Kirchhoff's current law over the network).
      expect(abs(sub(sumElectrodes(r.cases[k]), phasor(20000 * (1 - share), 0)))).toBeLessThan(1e-6);
    });
  });

  it('a stored earth-fault case without the new field reproduces the former arrangement (all current back through the source station)', () => {
    const study = bondingStudySchema.parse(JSON.parse(readFileSync('tests/fixtures/studies/fernhollow-cross-bonded.json', 'utf8')));
    const fe = study.cases.find((c) => c.kind === 'earth-fault')!;
    expect(fe.earthFault!.sourceStationShare).toBe(1);
    expect(abs(sumElectrodes(calculateBondingStudy(study).cases.find((c) => c.caseId === fe.id)!))).toBeLessThan(1e-6);
  });
});

describe('station earth potential rise carried into the route ends', () => {
  it('a grid the route leaves open rises by exactly the stated GPR, and the open sheath end sees it against the grid (Ohm\'s law at the grid)', () => {
    const study = referenceStudy({
      bonding: [{ kind: 'single-point', sectionIds: ['S1'], earthedAt: 'end' }],
      earthing: { routeStartOhm: 1.5, routeEndOhm: 0.3, linkBoxOhm: 5 },
      cases: [{ id: 'G', name: 'gpr', kind: 'station-gpr', durationS: 0.5, stationGpr: [{ station: 'start', voltageV: 3000, angleDeg: 20 }] }],
    });
    const start = calculateBondingStudy(study).cases[0].points[0];
    expect(relativeError(start.localEarth!.voltageV, 3000)).toBeLessThan(1e-12);
    expect(start.localEarth!.angleDeg).toBeCloseTo(20, 9);
    for (const e of start.sheathEnds) {
      expect(e.voltageV).toBeLessThan(1e-9);
      expect(relativeError(e.toLocalEarthV!, 3000)).toBeLessThan(1e-12);
    }
  });

  it('a grid bonded to the sheaths is loaded down by the route, and the result agrees with mathjs', () => {
    const study = solidRoute([{ id: 'G', name: 'gpr', kind: 'station-gpr', durationS: 0.5, stationGpr: [{ station: 'end', voltageV: 5000 }] }]);
    const end = calculateBondingStudy(study).cases[0].points.at(-1)!;
    expect(end.localEarth!.voltageV).toBeLessThan(5000);
    expect(end.localEarth!.voltageV).toBeGreaterThan(100);
    againstMathjs(study);
  });

  it('a station-rise case needs a rise; a load case cannot carry one', () => {
    const parsed = bondingStudySchema.safeParse(referenceStudyInput({ cases: [{ id: 'G', name: 'g', kind: 'station-gpr', durationS: 1 }, { id: 'N', name: 'n', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 100 }], stationGpr: [{ station: 'start', voltageV: 100 }] }] }));
    expect(parsed.success).toBe(false);
    const fields = parsed.success ? [] : describeIssues(parsed.error).map((i) => i.field);
    expect(fields).toEqual(['cases.0.stationGpr', 'cases.1.stationGpr']);
  });
});

describe('emergency load is its own case with its own currents', () => {
  it('the emergency standing voltage scales with the emergency current, not the normal one', () => {
    const r = calculateBondingStudy(referenceStudy({ cases: [
      { id: 'N', name: 'n', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 800 }] },
      { id: 'E', name: 'e', kind: 'emergency', currents: [{ circuitId: 'C1', currentA: 1200 }] },
    ] }));
    const worst = (id: string) => r.worst.find((w) => w.quantity === id)!;
    expect(relativeError(worst('standing-voltage-emergency').value, 1.5 * worst('standing-voltage-normal').value)).toBeLessThan(1e-12);
  });

  it('an emergency case without a current is refused', () => {
    const parsed = bondingStudySchema.safeParse(referenceStudyInput({ cases: [{ id: 'E', name: 'e', kind: 'emergency', currents: [] }] }));
    expect(parsed.success ? [] : describeIssues(parsed.error)).toContainEqual({ field: 'cases.0.currents', message: expect.stringContaining('current above zero') });
  });
});
