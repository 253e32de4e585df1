import { z } from 'zod';
import './plain-messages';
import { SWEEP_LIMITS, gridPointCount } from '../calc/explore/sweep-limits';

// What a designer asks of the exploration endpoints: the shape, the obvious ranges and the grid
// size (the core's own limits, checked again by checkSweep against the study).

const positive = (what: string) => z.number({ error: `${what} must be a number.` }).positive(`${what} must be greater than zero.`);

export const sweepInputSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('soil-resistivity') }),
    z.strictObject({ kind: z.literal('phase-spacing') }),
    z.strictObject({ kind: z.literal('depth') }),
    z.strictObject({ kind: z.literal('section-length'), sectionId: z.string().trim().min(1, 'Name the section.').max(40) }),
    z.strictObject({ kind: z.literal('load-current') }),
    z.strictObject({ kind: z.literal('fault-current') }),
    z.strictObject({ kind: z.literal('earth-resistance'), at: z.enum(['link-boxes', 'route-start', 'route-end'], { error: 'Earth resistance at: link-boxes, route-start or route-end.' }) }),
  ],
  { error: 'Input: soil-resistivity, phase-spacing, depth, section-length, load-current, fault-current or earth-resistance.' },
);

export const sweepAxisSchema = z
  .strictObject({
    input: sweepInputSchema,
    fromValue: positive('The range start'),
    toValue: positive('The range end'),
    points: z
      .number({ error: 'Points must be a number.' })
      .int('Points must be a whole number.')
      .min(1, 'Give at least one point.')
      .max(SWEEP_LIMITS.maxPointsPerAxis, `At most ${SWEEP_LIMITS.maxPointsPerAxis} points along one input.`),
  })
  .refine((a) => a.toValue >= a.fromValue, { message: 'The range must end at or above its start.', path: ['toValue'] });

export const explorationRequestSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('appraisal') }),
    z.strictObject({
      kind: z.literal('sweep'),
      axes: z
        .array(sweepAxisSchema)
        .min(1, 'Sweep one or two inputs.')
        .max(SWEEP_LIMITS.maxAxes, 'Sweep one or two inputs.')
        .check(
          z.superRefine((axes, ctx) => {
            const total = gridPointCount(axes);
            if (total > SWEEP_LIMITS.maxPoints) ctx.addIssue({ code: 'custom', message: `A sweep of ${total.toLocaleString('en-GB')} grid points is over the limit of ${SWEEP_LIMITS.maxPoints.toLocaleString('en-GB')}; use fewer points.` });
          }),
        ),
    }),
    z.strictObject({
      kind: z.literal('tornado'),
      inputs: z.array(z.strictObject({ input: sweepInputSchema, plusMinusPct: positive('The ± range').max(99, 'The ± range must stay below 100 %.') })).min(1, 'Give at least one input.').max(12, 'At most 12 inputs.'),
    }),
    z.strictObject({
      kind: z.literal('placement'),
      windows: z.array(z.strictObject({ fromM: z.number().nonnegative('A window cannot start before the route.'), toM: z.number().nonnegative() })).max(500, 'At most 500 windows.').default([]),
      drumLengthM: positive('The drum length'),
      minMinorLengthM: positive('The shortest minor section').optional(),
    }),
  ],
  { error: 'Kind: appraisal, sweep, tornado or placement.' },
);

export const bondingChoiceSchema = z.strictObject({
  explorationId: z.uuid('Give the appraisal the choice comes from.'),
  optionKey: z.enum(['current', 'solid', 'single-point-start', 'single-point-end', 'single-point-middle', 'cross-bonded', 'mixed'], { error: 'Choose one of the appraised options.' }),
  reason: z.string().trim().min(3, 'Say why this option is chosen.').max(2000, 'At most 2,000 characters.'),
});

export type ExplorationRequest = z.output<typeof explorationRequestSchema>;
