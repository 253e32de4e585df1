import { randomBytes } from 'node:crypto';
import { and, eq, gt, isNull, sql } from 'drizzle-orm';
import type { AppServices } from '../services';
import { accountUnlocks, users } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import { sha256Hex } from '../canonical-json';
import { MAIL_QUEUE } from '../mail/mail-delivery';
import { clearKeys } from './sign-in-throttle';
import { unlockMessage } from './unlock-message';

/** How long an unlock link works. While one is unused and valid, no second mail is sent. */
export const UNLOCK_VALID_MINUTES = 60;

/**
 * E-mails the owner of a just-locked account a single-use link that clears the lock. At most one
 * live link per account, so an attacker who keeps locking it cannot flood the owner's inbox.
 */
export async function issueUnlockLink(s: AppServices, user: { id: string; email: string; name: string }): Promise<boolean> {
  const token = randomBytes(24).toString('base64url');
  return inTransaction(s.pool, async (tx, sqlExecutor) => {
    // Serialises concurrent locks of the same account, so only one of them sends a link.
    await tx.select({ id: users.id }).from(users).where(eq(users.id, user.id)).for('update');
    const live = await tx
      .select({ tokenHash: accountUnlocks.tokenHash })
      .from(accountUnlocks)
      .where(and(eq(accountUnlocks.userId, user.id), isNull(accountUnlocks.usedAt), gt(accountUnlocks.expiresAt, sql`now()`)));
    if (live.length > 0) return false;
    await tx.insert(accountUnlocks).values({ tokenHash: sha256Hex(token), userId: user.id, expiresAt: sql`now() + make_interval(mins => ${UNLOCK_VALID_MINUTES})` });
    await appendAudit(tx, { actorId: null, type: 'user.locked', detail: { userId: user.id, email: user.email } });
    await s.jobs?.enqueue(sqlExecutor, MAIL_QUEUE, [unlockMessage(s.appUrl, user.email, user.name, token, UNLOCK_VALID_MINUTES)]);
    return true;
  });
}

/** Uses an unlock link: clears the account's failed sign-ins and lock. False when the link is used, expired or unknown. */
export async function redeemUnlockLink(s: AppServices, token: string): Promise<boolean> {
  return inTransaction(s.pool, async (tx) => {
    const [link] = await tx
      .update(accountUnlocks)
      .set({ usedAt: sql`now()` })
      .where(and(eq(accountUnlocks.tokenHash, sha256Hex(token)), isNull(accountUnlocks.usedAt), gt(accountUnlocks.expiresAt, sql`now()`)))
      .returning({ userId: accountUnlocks.userId });
    if (!link) return false;
    const [user] = await tx.select({ email: users.email }).from(users).where(eq(users.id, link.userId));
    if (!user) return false;
    await clearKeys(tx, [{ kind: 'account', key: user.email }]);
    await appendAudit(tx, { actorId: link.userId, type: 'user.unlocked', detail: { userId: link.userId, email: user.email } });
    return true;
  });
}
