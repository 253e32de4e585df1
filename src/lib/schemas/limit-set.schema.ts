import { z } from 'zod';
import './plain-messages';
import { manualItemSchema } from './manual-item.schema';

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

/** What an administrator publishes as a limit set's next version. */
export const limitSetVersionSchema = z.object({
  // A version without limits would let every computed check through as "no limit".
  limits: limitSetSchema.shape.limits.refine((l) => Object.keys(l).length > 0, 'Give at least one limit: a limit set without limits cannot be published.'),
  manualItems: z.array(manualItemSchema).refine((items) => new Set(items.map((i) => i.key)).size === items.length, 'Two questions share a key: each needs its own.'),
  checkTolerancePct: z.number().positive('The tolerance must be above zero.').max(50),
});

/** The unit each criterion's limit is given in. */
export const criterionUnits: Record<CriterionKey, Limit['unit']> = {
  'standing-voltage-normal': 'V',
  'standing-voltage-emergency': 'V',
  'joint-voltage-fault': 'V',
  'loss-factor': '',
  'ecc-current-fault': 'A',
  'metalwork-voltage-normal': 'V',
  'induced-emf-fault': 'V',
  'ac-current-density': 'A/m²',
};
