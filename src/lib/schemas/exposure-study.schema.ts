import { z } from 'zod';
import './plain-messages';
import { checkExposureStudy } from '../calc/exposure/exposure-checks';

// An exposure study: metalwork running parallel to current-carrying conductors (an overhead
// line, a cable route, a substation feeder) and the voltages induced on it.

const id = z.string().trim().min(1, 'Give an identifier.').max(40);
const positive = (what: string) => z.number({ error: `${what} must be a number.` }).positive(`${what} must be greater than zero.`);

const exposureStudyFieldsSchema = z
  .strictObject({
    kind: z.literal('exposure'),
    title: z.string().min(1, 'Give the study a title.'),
    frequencyHz: z.union([z.literal(50), z.literal(60)], { error: 'Frequency must be 50 or 60 Hz.' }),
    soilResistivityOhmM: positive('Soil resistivity').max(100_000, 'A soil resistivity above 100 000 Ω·m is not soil: check the units (Ω·m).'),
    /** Conductors carrying the inducing currents; y is height above ground (negative when buried). At most 40 (the core's conductor limit). */
    sources: z
      .array(z.strictObject({ id, name: z.string().default(''), xM: z.number(), yM: z.number() }))
      .min(1, 'Add at least one source conductor.')
      .max(40, 'At most 40 source conductors; split the study.'),
    object: z.strictObject({
      name: z.string().min(1, 'Name the metalwork.'),
      type: z.enum(['fence', 'pipeline', 'telecom-cable', 'pilot-cable', 'other']),
      xM: z.number(),
      yM: z.number(),
      parallelLengthM: positive('Length of parallelism')
        .min(0.001, 'A parallel run shorter than a millimetre is a typing error: check the units (metres).')
        .max(1_000_000, 'A parallel run longer than 1000 km is longer than any line: check the units (metres).'),
      resistanceOhmPerKm: positive('Resistance of the metalwork'),
      gmrMm: positive('Geometric mean radius of the metalwork'),
      /** Which ends are earthed; the other end is open (or insulated). */
      earthing: z.enum(['both-ends', 'start', 'end']),
      earthStartOhm: positive('Earth resistance at the start').default(10),
      earthEndOhm: positive('Earth resistance at the end').default(10),
      /** Screening factor k (1: no screening). */
      screeningFactor: z.number().gt(0, 'The screening factor must be above 0.').max(1, 'The screening factor cannot exceed 1.').default(1),
      /** Pipelines: diameter of the coating defect used for the a.c. current density. */
      coatingDefectDiameterMm: positive('Coating defect diameter').optional(),
    }),
    cases: z
      .array(
        z.strictObject({
          id,
          name: z.string().min(1),
          kind: z.enum(['normal', 'fault']),
          durationS: positive('Duration').optional(),
          currents: z
            .array(z.strictObject({ sourceId: id, currentA: z.number().nonnegative('Current cannot be negative.').max(500_000, 'A current above 500 kA is above any fault level: check the units (amperes).'), angleDeg: z.number().default(0) }))
            .min(1, 'Give the current in at least one source.')
            .max(40, 'At most 40 currents in a case.'),
        }),
      )
      .min(1, 'Add at least one case.')
      .max(200, 'At most 200 cases; split the study.'),
    /** Where people can touch the metalwork: the ground they stand on. */
    touch: z
      .object({
        bodyWeightKg: z.union([z.literal(50), z.literal(70)]).default(50),
        surfaceLayer: z.strictObject({ resistivityOhmM: positive('Surface layer resistivity'), thicknessM: positive('Surface layer thickness') }).optional(),
      })
      .default({ bodyWeightKg: 50 }),
  });

type ExposureStudyFields = z.output<typeof exposureStudyFieldsSchema>;

export const exposureStudySchema = exposureStudyFieldsSchema
  .check(
    // Cross-field checks run once every field is valid on its own.
    z.superRefine((study: ExposureStudyFields, ctx) => {
      for (const issue of checkExposureStudy(study)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
    }, { when: (payload) => payload.issues.length === 0 }),
  );

export type ExposureStudyInput = z.input<typeof exposureStudySchema>;
export type ExposureStudy = z.output<typeof exposureStudySchema>;
