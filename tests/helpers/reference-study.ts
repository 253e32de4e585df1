import { bondingStudySchema, type BondingStudy, type BondingStudyInput } from '../../src/lib/schemas/bonding-study.schema';

// Reference inputs of shared/reference/methods.md: f = 50 Hz, I = 1000 A, d = 0.100 m,
// Rs = 1.0e-4 Ω/m, R = 3.0e-5 Ω/m. The overall diameter is set to the spacing so that
// "touching" formations are legal; it does not enter the electrical calculation.

type Overrides = Partial<BondingStudyInput> & { formation?: 'trefoil' | 'flat'; spacingM?: number; currentA?: number };

export function referenceStudyInput(o: Overrides = {}): BondingStudyInput {
  const spacingM = o.spacingM ?? (o.formation === 'flat' ? 0.25 : 0.11);
  const { formation = 'trefoil', currentA = 1000, ...rest } = o;
  delete (rest as { spacingM?: number }).spacingM;
  return {
    kind: 'bonding',
    title: 'reference',
    frequencyHz: 50,
    soilResistivityOhmM: 100,
    cableTypes: [
      {
        id: 'REF',
        name: 'reference cable',
        conductorResistanceOhmPerKm: 0.03,
        conductorGmrMm: 20,
        sheathMeanDiameterMm: 100,
        sheathResistanceOhmPerKm: 0.1,
        oversheathThicknessMm: 4,
        overallDiameterMm: 110,
        oversheathWithstandKv: 20,
      },
    ],
    circuits: [{ id: 'C1', name: 'circuit 1', cableTypeId: 'REF' }],
    layouts: [{ id: 'L', circuits: [{ circuitId: 'C1', formation, spacingM, depthM: 1.2 }] }],
    sections: [{ id: 'S1', lengthM: 500, layoutId: 'L' }],
    bonding: [{ kind: 'single-point', sectionIds: ['S1'], earthedAt: 'start' }],
    earthing: { routeStartOhm: 1, routeEndOhm: 1, linkBoxOhm: 5 },
    cases: [{ id: 'LOAD', name: 'load', kind: 'normal', currents: [{ circuitId: 'C1', currentA }] }],
    ...rest,
  };
}

export function referenceStudy(o: Overrides = {}): BondingStudy {
  return bondingStudySchema.parse(referenceStudyInput(o));
}

/** Sections named S1…Sn with the given lengths, all on layout L. */
export const sections = (...lengths: number[]) => lengths.map((lengthM, i) => ({ id: `S${i + 1}`, lengthM, layoutId: 'L' }));

/** A tolerance check relative to the expected value. */
export function relativeError(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}
