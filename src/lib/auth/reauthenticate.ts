import type { AppServices } from '../services';
import { AppError } from '../errors';
import { issueUnlockLink } from './account-unlock';
import { type SignInPolicy, verifySignIn } from './sign-in';

// Signing a step (submit, pass, issue) asks for the person's password again in the same
// request. It is checked exactly as a sign-in is (verifySignIn): the same failure counters per
// e-mail and per client address, the same locks, the same unlock e-mail. So a stolen session
// cannot be used to guess the password faster than the sign-in page allows.

export interface Reauthentication {
  password: string | undefined;
  /** The client's address (the middleware's, never a header). */
  clientAddress: string;
  policy: SignInPolicy;
}

/** Throws unless `password` is the signed-in person's own password and neither counter is locked. */
export async function reauthenticate(s: AppServices, person: { id: string; email: string }, r: Reauthentication): Promise<void> {
  if (!r.password) throw new AppError('InvalidInput', 'Enter your password to sign this step.', [{ field: 'password', message: 'Enter your password to sign this step.' }]);
  const outcome = await verifySignIn(s.db, person.email, r.password, r.clientAddress, r.policy, {
    onAccountLocked: (user) => {
      void issueUnlockLink(s, user).catch((err) => console.error('[sign-off] unlock link not sent', err));
    },
  });
  if (!outcome.ok && outcome.reason === 'locked') {
    throw new AppError('Forbidden', 'Too many wrong passwords: signing and signing in are locked for a few minutes. Nothing was signed. Try again later, or use the unlock link e-mailed to you.');
  }
  if (!outcome.ok || outcome.user.id !== person.id) {
    throw new AppError('Forbidden', 'That is not your password: nothing was signed.', [{ field: 'password', message: 'That is not your password.' }]);
  }
}
