import { z } from 'zod';
import './plain-messages';

// Kept apart from the other request bodies so that the new-study form's bundle carries only this.

export const newStudySchema = z.object({
  code: z.string().trim().min(1, 'Give the study a code.').max(30),
  title: z.string().trim().min(3, 'Give the study a title.').max(200),
  kind: z.enum(['bonding', 'exposure']),
  limitSetId: z.uuid('Choose a limit set.'),
  inputs: z.unknown(),
});
