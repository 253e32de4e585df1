import { desc, eq, sql } from 'drizzle-orm';
import type { Database } from '../db/client';
import { auditCheckpoints, auditEvents } from '../db/schema';
import { compute, computeParallelism } from '../compute/compute-pool';
import { inScope, type AuditScope } from './audit-scope';
import { eventHash } from './audit-log';
import type { RangeReport } from './audit-verify-range';

export type VerifyMode = 'full' | 'incremental';

export interface ChainReport {
  /** Every event checked (every project's included) is intact. */
  ok: boolean;
  /** Events inside the caller's scope that were checked. */
  checked: number;
  /** The first broken event inside the caller's scope. */
  firstBroken?: { id: number; reason: string };
  /** A break was found at an event outside the caller's scope (not named: it is not theirs to see). */
  brokenOutsideScope?: true;
  mode: VerifyMode;
  /** Checking started after this event id (0: from the first event). Administrators only: ids outside a reader's scope are not theirs to see. */
  verifiedAfterId?: number;
  /** The last event checked (null: there was none to check). Administrators only. */
  verifiedUpToId?: number | null;
}

const CHECKPOINT_CHANGED = 'it was verified at the last checkpoint and has changed or gone since (run a full verification)';

/**
 * Verifies the hash chain. `full` recomputes it from the first event, so a change anywhere is
 * found. `incremental` starts after the latest checkpoint, once it has checked that the
 * checkpoint's event still carries the hash it was verified with; a change to an earlier event
 * is left to a full verification. The chain is split among the compute threads, each reading
 * its stretch on its own connection. An intact chain leaves a checkpoint at its last event.
 * The report names only events inside the caller's scope; a break elsewhere is reported as such.
 */
export async function verifyAuditChain(db: Database, databaseUrl: string, scope: AuditScope, mode: VerifyMode = 'full'): Promise<ChainReport> {
  let afterId = 0;
  if (mode === 'incremental') {
    const [checkpoint] = await db.select().from(auditCheckpoints).orderBy(desc(auditCheckpoints.id)).limit(1);
    if (checkpoint) {
      // The checkpoint's event must still be the one verified: its stored hash and its content.
      const [event] = await db.select().from(auditEvents).where(eq(auditEvents.id, checkpoint.eventId));
      if (!event || event.hash !== checkpoint.hash || eventHash(event) !== checkpoint.hash) {
        const named = event ? inScope(scope, event) : scope.all;
        const broken = named ? { firstBroken: { id: checkpoint.eventId, reason: CHECKPOINT_CHANGED } } : { brokenOutsideScope: true as const };
        return { ok: false, checked: 0, ...broken, mode, ...(scope.all ? { verifiedAfterId: checkpoint.eventId, verifiedUpToId: null } : {}) };
      }
      afterId = checkpoint.eventId;
    }
  }
  const [{ maxId }] = await db.select({ maxId: sql<string | null>`max(${auditEvents.id})` }).from(auditEvents);
  const upToId = maxId === null ? afterId : Number(maxId);
  const reports = await Promise.all(stretches(afterId, upToId, computeParallelism()).map(([from, to]) => compute({ task: 'verifyAudit', databaseUrl, scope, afterId: from, upToId: to })));
  const joined = join(reports);
  if (joined.ok && joined.last) await db.insert(auditCheckpoints).values({ eventId: joined.last.id, hash: joined.last.hash, mode });
  return {
    ok: joined.ok,
    checked: joined.checked,
    ...(joined.firstBroken ? { firstBroken: joined.firstBroken } : {}),
    ...(joined.brokenOutsideScope ? { brokenOutsideScope: true as const } : {}),
    mode,
    ...(scope.all ? { verifiedAfterId: afterId, verifiedUpToId: joined.last?.id ?? null } : {}),
  };
}

/** (after, upTo] cut into at most `parts` stretches of about equal id span. */
function stretches(afterId: number, upToId: number, parts: number): Array<[number, number]> {
  const span = upToId - afterId;
  if (span <= 0) return [];
  const n = Math.max(1, Math.min(parts, Math.ceil(span / 20_000)));
  return Array.from({ length: n }, (_, k) => [afterId + Math.floor((span * k) / n), k === n - 1 ? upToId : afterId + Math.floor((span * (k + 1)) / n)]);
}

/** The stretches' reports in chain order, as one. */
function join(reports: RangeReport[]) {
  const firstBroken = reports.find((r) => r.firstBroken)?.firstBroken;
  const brokenOutsideScope = reports.some((r) => r.brokenOutsideScope);
  const last = [...reports].reverse().find((r) => r.last)?.last ?? null;
  return { ok: !firstBroken && !brokenOutsideScope, checked: reports.reduce((n, r) => n + r.checked, 0), firstBroken, brokenOutsideScope, last };
}
