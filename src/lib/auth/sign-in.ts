import type { Database } from '../db/client';
import { findUserByEmail } from '../db/users.repo';
import { checkPassword, dummyPasswordHash } from './passwords';
import { anyLocked, clearKeys, countFailure, type ThrottleKey } from './sign-in-throttle';

export interface SignInPolicy {
  /** Wrong passwords for one e-mail, within `lockSeconds`, that lock it. */
  maxFailures: number;
  lockSeconds: number;
  /** Wrong passwords from one client address that lock the address (any e-mail). */
  maxFailuresPerAddress: number;
}

/** The per-address limit when none is configured: a busy office behind one address still fits. */
export const ADDRESS_FAILURE_FACTOR = 10;

export type SignInOutcome =
  | { ok: true; user: { id: string; email: string; name: string } }
  | { ok: false; reason: 'invalid' | 'locked' };

export interface SignInHooks {
  /** Called, not awaited, when wrong passwords have just locked an existing account. */
  onAccountLocked?: (user: { id: string; email: string; name: string }) => void;
}

const normaliseEmail = (email: string) => email.trim().toLowerCase();

/**
 * Checks an e-mail and password from a client address. Failures are counted per e-mail and per
 * address; while either is locked even the right password is refused. Every attempt, for an
 * account that exists or not, locked or not, runs one bcrypt comparison and the same throttle
 * queries, so neither the time taken nor the answer tells whether the account exists, and
 * "locked" says nothing about whether the password was right.
 */
export async function verifySignIn(
  db: Database,
  email: string,
  password: string,
  clientAddress: string,
  policy: SignInPolicy,
  hooks: SignInHooks = {},
): Promise<SignInOutcome> {
  const account: ThrottleKey = { kind: 'account', key: normaliseEmail(email) };
  const address: ThrottleKey = { kind: 'address', key: clientAddress };
  const [locked, user] = await Promise.all([anyLocked(db, [account, address]), findUserByEmail(db, email)]);
  const passwordMatches = await checkPassword(password, user?.passwordHash ?? (await dummyPasswordHash()));
  if (locked) return { ok: false, reason: 'locked' };
  if (!user?.passwordHash || !passwordMatches) {
    const [accountLockedNow] = await Promise.all([
      countFailure(db, account, policy),
      countFailure(db, address, { maxFailures: policy.maxFailuresPerAddress, lockSeconds: policy.lockSeconds }),
    ]);
    if (accountLockedNow && user) hooks.onAccountLocked?.({ id: user.id, email: user.email, name: user.name });
    return { ok: false, reason: 'invalid' };
  }
  await clearKeys(db, [account]);
  return { ok: true, user: { id: user.id, email: user.email, name: user.name } };
}
