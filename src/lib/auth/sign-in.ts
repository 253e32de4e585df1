import type { Database } from '../db/client';
import { clearFailedSignIns, findUserByEmail, recordFailedSignIn } from '../db/users.repo';
import { checkPassword } from './passwords';

export interface SignInPolicy {
  maxFailures: number;
  lockSeconds: number;
}

export type SignInOutcome =
  | { ok: true; user: { id: string; email: string; name: string } }
  | { ok: false; reason: 'invalid' | 'locked' };

/**
 * Checks an e-mail and password. After `maxFailures` wrong passwords in a row the account is
 * locked for `lockSeconds`; while locked even the right password is refused.
 */
export async function verifySignIn(
  db: Database,
  email: string,
  password: string,
  policy: SignInPolicy,
): Promise<SignInOutcome> {
  const user = await findUserByEmail(db, email);
  if (!user || !user.passwordHash) return { ok: false, reason: 'invalid' };
  if (user.lockedUntil && user.lockedUntil.getTime() > Date.now()) return { ok: false, reason: 'locked' };
  if (!(await checkPassword(password, user.passwordHash))) {
    await recordFailedSignIn(db, user.id, policy.maxFailures, policy.lockSeconds);
    return { ok: false, reason: 'invalid' };
  }
  if (user.failedSignIns > 0 || user.lockedUntil) await clearFailedSignIns(db, user.id);
  return { ok: true, user: { id: user.id, email: user.email, name: user.name } };
}
