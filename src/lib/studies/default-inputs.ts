import type { BondingStudyInput } from '../schemas/bonding-study.schema';
import type { ExposureStudyInput } from '../schemas/exposure-study.schema';

// The starting inputs of a new study: small, valid, and obviously to be replaced. Values are
// illustrative only.

export function defaultBondingInputs(title: string): BondingStudyInput {
  return {
    kind: 'bonding',
    title,
    frequencyHz: 50,
    soilResistivityOhmM: 100,
    cableTypes: [{ id: 'CT1', name: 'Replace with the cable maker\'s data', conductorResistanceOhmPerKm: 0.0247, conductorGmrMm: 14.6, sheathMeanDiameterMm: 95, sheathResistanceOhmPerKm: 0.09, oversheathThicknessMm: 4.5, overallDiameterMm: 105, oversheathWithstandKv: 20 }],
    circuits: [{ id: 'C1', name: 'Circuit 1', cableTypeId: 'CT1' }],
    eccs: [],
    layouts: [{ id: 'L1', name: 'trefoil touching', circuits: [{ circuitId: 'C1', formation: 'trefoil', spacingM: 0.105, depthM: 1.2, centreXM: 0 }], eccs: [] }],
    sections: [
      { id: 'S1', lengthM: 500, layoutId: 'L1', phaseRotation: 0 },
      { id: 'S2', lengthM: 500, layoutId: 'L1', phaseRotation: 0 },
      { id: 'S3', lengthM: 500, layoutId: 'L1', phaseRotation: 0 },
    ],
    bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }],
    earthing: { routeStartOhm: 1, routeEndOhm: 1, linkBoxOhm: 5, overrides: [] },
    bondingLeadMilliohm: { r: 0, x: 0 },
    svls: [],
    cases: [
      { id: 'LOAD', name: 'Normal load', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 800, angleDeg: 0 }], svlsConducting: false },
      { id: 'F3', name: 'Three-phase through fault', kind: 'three-phase-fault', durationS: 1, currents: [{ circuitId: 'C1', currentA: 25000, angleDeg: 0 }], svlsConducting: false },
    ],
  };
}

export function defaultExposureInputs(title: string): ExposureStudyInput {
  return {
    kind: 'exposure',
    title,
    frequencyHz: 50,
    soilResistivityOhmM: 100,
    sources: [{ id: 'F', name: 'earth-return fault current', xM: 0, yM: 10 }],
    object: { name: 'Parallel fence', type: 'fence', xM: 30, yM: 1, parallelLengthM: 500, resistanceOhmPerKm: 2.5, gmrMm: 3, earthing: 'start', earthStartOhm: 10, earthEndOhm: 10, screeningFactor: 1 },
    cases: [{ id: 'FE', name: 'Earth fault', kind: 'fault', durationS: 0.5, currents: [{ sourceId: 'F', currentA: 5000, angleDeg: 0 }] }],
    touch: { bodyWeightKg: 50 },
  };
}
