import { z } from 'zod';

/** Criteria a limit set can give a value for; other checks take their limit from the study (SVL ratings, oversheath withstand, IEEE 80 tolerable voltages). */
export const criterionKeys = [
  'standing-voltage-normal',
  'standing-voltage-emergency',
  'joint-voltage-fault',
  'loss-factor',
  'ecc-current-fault',
  'metalwork-voltage-normal',
  'induced-emf-fault',
  'ac-current-density',
] as const;

export type CriterionKey = (typeof criterionKeys)[number];

export const limitSchema = z.object({
  value: z.number().positive('A limit must be greater than zero.'),
  unit: z.enum(['V', 'A', 'A/m²', '']),
  /** Where the value comes from: a document and clause, "common practice", or "owner's standard". */
  source: z.string().trim().min(3, 'Say where this value comes from.'),
});

export const limitSetSchema = z.object({
  name: z.string().min(1),
  version: z.number().int().positive(),
  limits: z.partialRecord(z.enum(criterionKeys), limitSchema),
});

export type LimitSet = z.output<typeof limitSetSchema>;
export type Limit = z.output<typeof limitSchema>;
