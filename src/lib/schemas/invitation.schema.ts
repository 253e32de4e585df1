import { z } from 'zod';
import './plain-messages';

// Kept apart from the other request bodies so that the administration form's bundle carries only this.

export const invitationSchema = z.object({
  email: z.email('This is not an e-mail address.').transform((e) => e.toLowerCase()),
  name: z.string().trim().min(2, 'Give the person\'s name.'),
  isAdmin: z.boolean().default(false),
});
