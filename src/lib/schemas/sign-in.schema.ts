import { z } from 'zod';
import './plain-messages';

export const signInSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address.').email('This is not an e-mail address.'),
  password: z.string().min(1, 'Enter your password.'),
});

export type SignInInput = z.input<typeof signInSchema>;
