import { z } from 'zod';
import './plain-messages';

// Kept apart from the other request bodies so that the invitation page's bundle carries only this.

export const acceptInvitationSchema = z.object({
  token: z.string().min(20),
  password: z.string().min(10, 'Choose a password of at least 10 characters.').max(200),
});
