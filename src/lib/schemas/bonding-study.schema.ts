import { z } from 'zod';
import { checkBondingStudy } from '../calc/bonding/study-checks';

// The input of a bonding study: one schema for the forms, the endpoints, the command line and
// the stored JSON. Units are in the field names. Cross-field rules (geometry, topology) live
// in the calculation core and are reported here field by field.

const id = z.string().trim().min(1, 'Give an identifier.').max(40);
const positive = (what: string) => z.number({ error: `${what} must be a number.` }).positive(`${what} must be greater than zero.`);
const nonNegative = (what: string) => z.number({ error: `${what} must be a number.` }).nonnegative(`${what} cannot be negative.`);

export const cableTypeSchema = z.object({
  id,
  name: z.string().min(1),
  conductorResistanceOhmPerKm: positive('Conductor a.c. resistance at operating temperature'),
  conductorGmrMm: positive('Conductor geometric mean radius'),
  sheathMeanDiameterMm: positive('Sheath mean diameter'),
  sheathResistanceOhmPerKm: positive('Sheath resistance at operating temperature'),
  oversheathThicknessMm: positive('Oversheath thickness'),
  overallDiameterMm: positive('Overall cable diameter'),
  /** Power-frequency withstand of the oversheath, r.m.s., for the fault duration. */
  oversheathWithstandKv: positive('Oversheath withstand voltage'),
});

export const circuitSchema = z.object({
  id,
  name: z.string().min(1),
  cableTypeId: id,
});

export const eccSchema = z.object({
  id,
  name: z.string().min(1),
  resistanceOhmPerKm: positive('ECC resistance'),
  gmrMm: positive('ECC geometric mean radius'),
  /** First and last section (ids) the ECC runs along; it is earthed at both ends of its run. */
  fromSectionId: id,
  toSectionId: id,
  /** Cross the ECC to the mirror position at the middle of its run. */
  transposedAtMidpoint: z.boolean().default(false),
});

const formationSchema = z.discriminatedUnion('formation', [
  z.object({
    circuitId: id,
    formation: z.literal('trefoil'),
    /** Axial spacing of adjacent cables; touching trefoil equals the overall diameter. */
    spacingM: positive('Spacing'),
    depthM: positive('Depth'),
    centreXM: z.number().default(0),
  }),
  z.object({
    circuitId: id,
    formation: z.literal('flat'),
    spacingM: positive('Spacing'),
    depthM: positive('Depth'),
    centreXM: z.number().default(0),
  }),
  z.object({
    circuitId: id,
    formation: z.literal('coordinates'),
    /** Positions of the cables carrying phases a, b, c (x across the route, depth below ground). */
    positions: z.array(z.object({ xM: z.number(), depthM: positive('Depth') })).length(3, 'Give three positions: a, b and c.'),
  }),
]);

export const layoutSchema = z.object({
  id,
  name: z.string().default(''),
  circuits: z.array(formationSchema).min(1, 'Place at least one circuit.'),
  eccs: z.array(z.object({ eccId: id, xM: z.number(), depthM: positive('ECC depth') })).default([]),
});

export const sectionSchema = z.object({
  id,
  lengthM: positive('Section length'),
  layoutId: id,
  /** Cable transposition at the section's start: the cables shift this many positions (0, 1, 2). */
  phaseRotation: z.union([z.literal(0), z.literal(1), z.literal(2)]).default(0),
});

export const bondingGroupSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('solid'), sectionIds: z.array(id).min(1) }),
  z.object({
    kind: z.literal('single-point'),
    sectionIds: z.array(id).min(1),
    earthedAt: z.enum(['start', 'end', 'middle']),
  }),
  z.object({ kind: z.literal('cross-bonded'), sectionIds: z.array(id) }),
]);

export const svlSchema = z.object({
  /** Joint number along the route: 0 is the route start, n the end, k the joint after the k-th section. */
  jointIndex: z.number().int().nonnegative(),
  connection: z.enum(['to-earth', 'across-joint']),
  continuousRatingV: positive('SVL continuous operating voltage'),
  /** Temporary-overvoltage capability for the fault duration (maker's data). */
  tovRatingV: positive('SVL temporary-overvoltage capability'),
  conductingResistanceOhm: positive('SVL resistance when conducting').default(0.5),
});

const phase = z.enum(['a', 'b', 'c']);

export const caseSchema = z.object({
  id,
  name: z.string().min(1),
  kind: z.enum(['normal', 'emergency', 'three-phase-fault', 'earth-fault']),
  /** Fault duration including back-up clearance, s; needed for faults. */
  durationS: positive('Duration').optional(),
  /** Balanced positive-sequence currents per circuit (load or three-phase fault). */
  currents: z.array(z.object({ circuitId: id, currentA: nonNegative('Current'), angleDeg: z.number().default(0) })).default([]),
  earthFault: z
    .object({
      circuitId: id,
      phase,
      currentA: positive('Earth-fault current'),
      /** The fault lies beyond this end of the route; the source neutral is at the other end. */
      beyond: z.enum(['start', 'end']).default('end'),
    })
    .optional(),
  svlsConducting: z.boolean().default(false),
});

export const earthingSchema = z.object({
  routeStartOhm: positive('Earth resistance at the route start'),
  routeEndOhm: positive('Earth resistance at the route end'),
  linkBoxOhm: positive('Earth resistance at link boxes'),
  overrides: z.array(z.object({ jointIndex: z.number().int().nonnegative(), resistanceOhm: positive('Earth resistance') })).default([]),
});

export const bondingStudyBaseSchema = z.object({
  kind: z.literal('bonding'),
  title: z.string().min(1, 'Give the study a title.'),
  frequencyHz: z.union([z.literal(50), z.literal(60)], { error: 'Frequency must be 50 or 60 Hz.' }),
  soilResistivityOhmM: positive('Soil resistivity'),
  cableTypes: z.array(cableTypeSchema).min(1, 'Add a cable type.'),
  circuits: z.array(circuitSchema).min(1, 'Add a circuit.'),
  eccs: z.array(eccSchema).default([]),
  layouts: z.array(layoutSchema).min(1, 'Add a layout.'),
  sections: z.array(sectionSchema).min(1, 'Add at least one route section.'),
  bonding: z.array(bondingGroupSchema).min(1, 'Say how the sheaths are bonded.'),
  earthing: earthingSchema,
  /** Impedance of each cross-bonding lead, mΩ (0: ideal). */
  bondingLeadMilliohm: z.object({ r: nonNegative('Lead resistance'), x: nonNegative('Lead reactance') }).default({ r: 0, x: 0 }),
  svls: z.array(svlSchema).default([]),
  cases: z.array(caseSchema).min(1, 'Add at least one case.'),
});

// Cross-field checks run once every field is valid on its own, so they can trust the numbers.
const onlyWhenFieldsValid = { when: (payload: { issues: unknown[] }) => payload.issues.length === 0 };

export const bondingStudySchema = bondingStudyBaseSchema.check(
  z.superRefine((study: z.output<typeof bondingStudyBaseSchema>, ctx) => {
    for (const issue of checkBondingStudy(study)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
  }, onlyWhenFieldsValid),
);

export type BondingStudyInput = z.input<typeof bondingStudySchema>;
export type BondingStudy = z.output<typeof bondingStudySchema>;
export type CableType = z.output<typeof cableTypeSchema>;
export type StudyCase = z.output<typeof caseSchema>;
export type Layout = z.output<typeof layoutSchema>;
