import { bondingStudySchema, type BondingStudy, type BondingStudyInput } from '../src/lib/schemas/bonding-study.schema';

// Benchmark routes built in code (invented): cross-bonded major sections with unequal minor
// lengths from a fixed pseudo-random sequence, so every run solves the same systems.

function lengths(count: number, seed: number): number[] {
  let s = seed;
  return Array.from({ length: count }, () => {
    s = (s * 1103515245 + 12345) % 2 ** 31;
    return 440 + Math.round((s / 2 ** 31) * 120);
  });
}

export function crossBondedRoute({ circuits, majorSections, withEcc }: { circuits: 1 | 2; majorSections: number; withEcc: boolean }): BondingStudy {
  const minor = lengths(majorSections * 3, 7);
  const circuitIds = circuits === 2 ? ['C1', 'C2'] : ['C1'];
  const sections = minor.map((lengthM, i) => ({ id: `S${i + 1}`, lengthM, layoutId: 'L' }));
  const input: BondingStudyInput = {
    kind: 'bonding',
    title: `benchmark: ${circuits} circuit(s), ${majorSections} major sections`,
    frequencyHz: 50,
    soilResistivityOhmM: 100,
    cableTypes: [
      {
        id: 'T',
        name: 'benchmark cable',
        conductorResistanceOhmPerKm: 0.0247,
        conductorGmrMm: 14.6,
        sheathMeanDiameterMm: 95,
        sheathResistanceOhmPerKm: 0.09,
        oversheathThicknessMm: 4.5,
        overallDiameterMm: 105,
        oversheathWithstandKv: 20,
      },
    ],
    circuits: circuitIds.map((id) => ({ id, name: id, cableTypeId: 'T' })),
    eccs: withEcc ? [{ id: 'E', name: 'ECC', resistanceOhmPerKm: 0.06, gmrMm: 8.6, fromSectionId: 'S1', toSectionId: `S${minor.length}` }] : [],
    layouts: [
      {
        id: 'L',
        circuits: circuitIds.map((circuitId, k) => ({ circuitId, formation: 'trefoil' as const, spacingM: 0.105, depthM: 1.2, centreXM: circuits === 2 ? (k === 0 ? -0.4 : 0.4) : 0 })),
        eccs: withEcc ? [{ eccId: 'E', xM: 0, depthM: 1.0 }] : [],
      },
    ],
    sections,
    bonding: Array.from({ length: majorSections }, (_, m) => ({ kind: 'cross-bonded' as const, sectionIds: [1, 2, 3].map((k) => `S${m * 3 + k}`) })),
    earthing: { routeStartOhm: 0.2, routeEndOhm: 0.3, linkBoxOhm: 5 },
    cases: eightCases(circuitIds),
  };
  return bondingStudySchema.parse(input);
}

function eightCases(circuitIds: string[]): BondingStudyInput['cases'] {
  const all = (currentA: number) => circuitIds.map((circuitId) => ({ circuitId, currentA }));
  return [
    { id: 'N', name: 'normal', kind: 'normal', currents: all(850) },
    { id: 'E', name: 'emergency', kind: 'emergency', currents: all(1050) },
    { id: 'F3', name: 'three-phase fault', kind: 'three-phase-fault', durationS: 1, currents: all(31500) },
    { id: 'F3L', name: 'three-phase fault, lower', kind: 'three-phase-fault', durationS: 1, currents: all(20000) },
    ...(['a', 'b', 'c'] as const).map((phase) => ({ id: `FE${phase}`, name: `earth fault ${phase}`, kind: 'earth-fault' as const, durationS: 1, currents: all(850), earthFault: { circuitId: 'C1', phase, currentA: 20000, beyond: 'end' as const } })),
    { id: 'FEs', name: 'earth fault beyond the start', kind: 'earth-fault', durationS: 1, currents: all(850), earthFault: { circuitId: 'C1', phase: 'a', currentA: 20000, beyond: 'start' } },
  ];
}
