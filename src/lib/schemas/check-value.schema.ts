import { z } from 'zod';
import './plain-messages';

// Kept apart from the other request bodies so that the check-values tab's bundle carries only these.

export const checkValueSchema = z.object({
  itemKey: z.string().min(1, 'Choose the result you checked.'),
  checkerValue: z.number({ error: 'Enter your value as a number.' }).finite(),
  explanation: z.string().trim().max(2000).optional(),
});

/** A correction of the checker's own check value (the item stays the same). */
export const checkValueUpdateSchema = checkValueSchema.omit({ itemKey: true });
