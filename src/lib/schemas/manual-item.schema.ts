import { z } from 'zod';
import './plain-messages';

/** A checklist question answered by people, kept with the limit set. */
export const manualItemSchema = z.object({
  key: z.string().min(1),
  text: z.string().min(1),
  /** "common practice", or the document and clause it comes from. */
  basis: z.string().min(3),
});

export type ManualItem = z.output<typeof manualItemSchema>;
