import type { AppServices } from '../services';
import type { Database } from './client';
import { inTransaction, type SqlExecutor } from './transaction';
import { loadRevisionScope } from './revisions.repo';

export type RevisionScope = Awaited<ReturnType<typeof lockRevisionScope>>;

/**
 * The revision with its study and project, with the revision row locked until the caller's
 * transaction ends. Every write that depends on the revision's state, or that a workflow guard
 * reads, takes this lock first, so it is ordered strictly before or after each hand-off.
 */
export const lockRevisionScope = (tx: Database, revisionId: string) => loadRevisionScope(tx, revisionId, { lock: true });

/** Runs `work` in one transaction that holds the revision's row lock from the start. */
export function withLockedRevision<T>(
  s: Pick<AppServices, 'pool'>,
  revisionId: string,
  work: (scope: RevisionScope, tx: Database, sqlExecutor: SqlExecutor) => Promise<T>,
): Promise<T> {
  return inTransaction(s.pool, async (tx, sqlExecutor) => work(await lockRevisionScope(tx, revisionId), tx, sqlExecutor));
}
