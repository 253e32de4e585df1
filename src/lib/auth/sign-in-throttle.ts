import { and, eq, gt, inArray, or, sql } from 'drizzle-orm';
import type { Database } from '../db/client';
import { signInThrottles, type ThrottleKind } from '../db/schema';

export interface ThrottlePolicy {
  /** Failures within the window that lock the key. */
  maxFailures: number;
  /** How long a lock lasts, and how long a failure is remembered. */
  lockSeconds: number;
}

export interface ThrottleKey {
  kind: ThrottleKind;
  key: string;
}

/** True when any of the keys is locked now. */
export async function anyLocked(db: Database, keys: ThrottleKey[]): Promise<boolean> {
  const rows = await db
    .select({ kind: signInThrottles.kind })
    .from(signInThrottles)
    .where(and(or(...keys.map((k) => and(eq(signInThrottles.kind, k.kind), eq(signInThrottles.key, k.key)))), gt(signInThrottles.lockedUntil, sql`now()`)))
    .limit(1);
  return rows.length > 0;
}

/**
 * Counts one failure against a key, in one statement so concurrent failures cannot undercount.
 * Failures older than the window are forgotten. Returns true when this failure set the lock.
 */
export async function countFailure(db: Database, key: ThrottleKey, policy: ThrottlePolicy): Promise<boolean> {
  const window = sql`make_interval(secs => ${policy.lockSeconds})`;
  const expired = sql`${signInThrottles.windowStartedAt} < now() - ${window}`;
  const failures = sql`case when ${expired} then 1 else ${signInThrottles.failures} + 1 end`;
  const [row] = await db
    .insert(signInThrottles)
    .values({
      kind: key.kind,
      key: key.key,
      failures: 1,
      lockedUntil: policy.maxFailures <= 1 ? sql`now() + ${window}` : null,
    })
    .onConflictDoUpdate({
      target: [signInThrottles.kind, signInThrottles.key],
      set: {
        failures,
        windowStartedAt: sql`case when ${expired} then now() else ${signInThrottles.windowStartedAt} end`,
        lockedUntil: sql`case when ${failures} >= ${policy.maxFailures} then now() + ${window} else ${signInThrottles.lockedUntil} end`,
      },
    })
    .returning({ failures: signInThrottles.failures });
  return row.failures === policy.maxFailures;
}

/** Forgets the failures of keys (a right password, or the owner's unlock link). */
export async function clearKeys(db: Database, keys: ThrottleKey[]): Promise<void> {
  for (const kind of new Set(keys.map((k) => k.kind))) {
    await db.delete(signInThrottles).where(and(eq(signInThrottles.kind, kind), inArray(signInThrottles.key, keys.filter((k) => k.kind === kind).map((k) => k.key))));
  }
}
