import type { BondingStudyInput } from '../schemas/bonding-study.schema';

/** Removes a circuit with its placements and currents; cases that fault it are removed too, and said. */
export function removeCircuit(study: BondingStudyInput, circuitId: string): { study: BondingStudyInput; notes: string[] } {
  const notes: string[] = [`Circuit ${circuitId} removed with its place in every layout and its currents.`];
  const faults = (c: BondingStudyInput['cases'][number]) => [c.earthFault, c.phasePhaseEarthFault, c.internalFault].some((f) => f?.circuitId === circuitId);
  const cases = study.cases.filter((c) => {
    if (faults(c)) notes.push(`Case ${c.id} faulted ${circuitId} and is removed.`);
    return !faults(c);
  }).map((c) => ({ ...c, currents: (c.currents ?? []).filter((x) => x.circuitId !== circuitId) }));
  return {
    study: {
      ...study,
      circuits: study.circuits.filter((c) => c.id !== circuitId),
      layouts: study.layouts.map((l) => ({ ...l, circuits: l.circuits.filter((p) => p.circuitId !== circuitId) })),
      cases,
    },
    notes,
  };
}
