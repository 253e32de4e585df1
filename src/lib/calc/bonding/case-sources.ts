import type { BondingStudy, StudyCase } from '../../schemas/bonding-study.schema';
import { type Complex, ZERO, polar } from '../complex';
import type { BondingNetworkModel } from './network-model';

/**
 * The source vector of a case: the current in each phase core (positive direction from the
 * route start to its end), then the earth-fault current that enters the earth beyond the
 * faulted end. Balanced sets are positive sequence: I∠θ, I∠θ−120°, I∠θ+120°.
 */
export function caseSources(study: BondingStudy, model: BondingNetworkModel, c: StudyCase): Complex[] {
  const sources: Complex[] = Array.from({ length: model.cables.length + 1 }, () => ZERO);
  const offset = (circuitId: string) => study.circuits.findIndex((x) => x.id === circuitId) * 3;
  for (const cur of c.currents) {
    [0, -120, 120].forEach((shift, p) => {
      sources[offset(cur.circuitId) + p] = polar(cur.currentA, cur.angleDeg + shift);
    });
  }
  if (c.kind === 'earth-fault' && c.earthFault) {
    const f = c.earthFault;
    const signed = polar(f.currentA, f.beyond === 'end' ? 0 : 180);
    // The faulted circuit carries the fault current alone; its load is neglected.
    [0, 1, 2].forEach((p) => (sources[offset(f.circuitId) + p] = ZERO));
    sources[offset(f.circuitId) + 'abc'.indexOf(f.phase)] = signed;
    sources[model.faultSourceIndex] = signed;
  }
  return sources;
}

/** Magnitude of the balanced current of a cable's circuit in a case, A (0 if none). */
export function circuitCurrentA(c: StudyCase, circuitId: string): number {
  return c.currents.find((x) => x.circuitId === circuitId)?.currentA ?? 0;
}
