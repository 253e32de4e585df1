// The fields each kind of case carries, so that changing a case's kind gives it the right ones
// (the schema refuses a field that belongs to another kind). Starting values are placeholders.

export const CASE_KINDS: Array<[string, string]> = [
  ['normal', 'normal load'],
  ['emergency', 'emergency load'],
  ['three-phase-fault', 'three-phase through fault'],
  ['earth-fault', 'phase-to-earth through fault'],
  ['phase-phase-earth-fault', 'phase-to-phase-to-earth through fault'],
  ['internal-fault', 'internal fault (core to sheath on the route)'],
  ['station-gpr', 'station earth potential rise'],
];

type Case = Record<string, unknown> & { id: string; name: string; kind: string };

/** The case with the fields of `kind`: what it shares with the old kind is kept. */
export function caseOfKind(old: Case, kind: string, circuitIds: string[]): Case {
  const base: Case = { id: old.id, name: old.name, kind, svlsConducting: old.svlsConducting ?? false };
  const circuitId = circuitIds[0] ?? '';
  const balanced = (amps: number) => (Array.isArray(old.currents) && old.currents.length ? old.currents : circuitIds.map((id) => ({ circuitId: id, currentA: amps, angleDeg: 0 })));
  const duration = { durationS: (old.durationS as number | undefined) ?? 1 };
  switch (kind) {
    case 'normal':
    case 'emergency':
      return { ...base, currents: balanced(800) };
    case 'three-phase-fault':
      return { ...base, ...duration, currents: balanced(25000) };
    case 'earth-fault':
      return { ...base, ...duration, earthFault: { circuitId, phase: 'a', currentA: 20000, beyond: 'end', sourceStationShare: 1 } };
    case 'phase-phase-earth-fault':
      return { ...base, ...duration, phasePhaseEarthFault: { circuitId, phases: ['b', 'c'], currents: [{ currentA: 20000, angleDeg: -120 }, { currentA: 20000, angleDeg: 120 }], beyond: 'end', sourceStationShare: 1 } };
    case 'internal-fault':
      return { ...base, ...duration, internalFault: { circuitId, phase: 'a', jointIndex: 1, side: 'arriving', fromStart: { currentA: 20000, angleDeg: 0 }, fromEnd: { currentA: 0, angleDeg: 0 } } };
    case 'station-gpr':
      return { ...base, ...duration, stationGpr: [{ station: 'start', voltageV: 1000, angleDeg: 0 }] };
    default:
      return base;
  }
}
