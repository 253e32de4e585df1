import type { BondingStudy, StudyCase } from '../../schemas/bonding-study.schema';
import { type Complex, ZERO, add, polar, scale } from '../complex';
import type { SegmentSources } from '../network';
import type { BondingNetworkModel } from './network-model';

/**
 * The source vector of a case: the current in each phase core (positive direction from the
 * route start to its end), then the current entering the earth at the end station grid and at
 * the start station grid, then one entry per internal-fault case (the current entering the
 * faulted sheath). Balanced sets are positive sequence: I∠θ, I∠θ−120°, I∠θ+120°.
 */
export function caseSources(study: BondingStudy, model: BondingNetworkModel, c: StudyCase): Complex[] {
  const sources: Complex[] = Array.from({ length: model.sourceCount }, () => ZERO);
  const offset = (circuitId: string) => study.circuits.findIndex((x) => x.id === circuitId) * 3;
  for (const cur of c.currents) {
    [0, -120, 120].forEach((shift, p) => {
      sources[offset(cur.circuitId) + p] = polar(cur.currentA, cur.angleDeg + shift);
    });
  }
  // A through fault beyond one end: the faulted phases carry their currents from the source
  // station to the far end, where the residual enters the earth; the source-end grid draws
  // its share back to the source neutral, the rest returns by paths outside this route.
  const through = (circuitId: string, phases: Array<{ phase: 'a' | 'b' | 'c'; current: Complex }>, beyond: 'start' | 'end', share: number) => {
    const dir = beyond === 'end' ? 1 : -1;
    // The faulted circuit carries the fault current alone; its load is neglected.
    [0, 1, 2].forEach((p) => (sources[offset(circuitId) + p] = ZERO));
    let residual = ZERO;
    for (const { phase, current } of phases) {
      sources[offset(circuitId) + 'abc'.indexOf(phase)] = scale(current, dir);
      residual = add(residual, current);
    }
    sources[beyond === 'end' ? model.earthAtEndIndex : model.earthAtStartIndex] = residual;
    sources[beyond === 'end' ? model.earthAtStartIndex : model.earthAtEndIndex] = scale(residual, -share);
  };
  if (c.kind === 'earth-fault' && c.earthFault) {
    const f = c.earthFault;
    through(f.circuitId, [{ phase: f.phase, current: polar(f.currentA, 0) }], f.beyond, f.sourceStationShare);
  }
  if (c.kind === 'phase-phase-earth-fault' && c.phasePhaseEarthFault) {
    const f = c.phasePhaseEarthFault;
    through(f.circuitId, f.phases.map((phase, k) => ({ phase, current: polar(f.currents[k].currentA, f.currents[k].angleDeg) })), f.beyond, f.sourceStationShare);
  }
  if (c.kind === 'internal-fault' && c.internalFault) {
    const f = c.internalFault;
    const fromStart = polar(f.fromStart.currentA, f.fromStart.angleDeg);
    const fromEnd = polar(f.fromEnd.currentA, f.fromEnd.angleDeg);
    [0, 1, 2].forEach((p) => (sources[offset(f.circuitId) + p] = ZERO));
    // Core currents are set per segment (internalFaultSegmentSources); the breakdown puts both
    // infeeds into the sheath, and each returns to the source neutral at its own station grid.
    sources[model.internalFaults.get(c.id)!.sourceIndex] = add(fromStart, fromEnd);
    sources[model.earthAtStartIndex] = add(sources[model.earthAtStartIndex], scale(fromStart, -1));
    sources[model.earthAtEndIndex] = add(sources[model.earthAtEndIndex], scale(fromEnd, -1));
  }
  // Station rise from elsewhere: a Norton current GPR/R_grid into that station's grid.
  for (const g of c.stationGpr) {
    const index = g.station === 'start' ? model.earthAtStartIndex : model.earthAtEndIndex;
    const gridOhm = g.station === 'start' ? model.routeStartOhm : model.routeEndOhm;
    sources[index] = add(sources[index], scale(polar(g.voltageV, g.angleDeg), 1 / gridOhm));
  }
  return sources;
}

/**
 * Where a case's core currents change along the route (an internal fault: the start infeed
 * before the fault point, the end infeed, flowing back towards it, after), the source vector
 * of each segment; otherwise undefined and every segment sees the case's vector.
 */
export function caseSegmentSources(study: BondingStudy, model: BondingNetworkModel, c: StudyCase, sources: Complex[]): SegmentSources | undefined {
  if (c.kind !== 'internal-fault' || !c.internalFault) return undefined;
  const f = c.internalFault;
  const core = study.circuits.findIndex((x) => x.id === f.circuitId) * 3 + 'abc'.indexOf(f.phase);
  const before = [...sources];
  before[core] = polar(f.fromStart.currentA, f.fromStart.angleDeg);
  const after = [...sources];
  after[core] = scale(polar(f.fromEnd.currentA, f.fromEnd.angleDeg), -1);
  const faultJoint = model.internalFaults.get(c.id)!.joint;
  // Network segment k is route segment k, from joint k to joint k + 1.
  return (k) => (k < faultJoint ? before : after);
}

/** Magnitude of the balanced current of a cable's circuit in a case, A (0 if none). */
export function circuitCurrentA(c: StudyCase, circuitId: string): number {
  return c.currents.find((x) => x.circuitId === circuitId)?.currentA ?? 0;
}
