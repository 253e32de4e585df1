import { eq } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { Database } from './client';
import { projects, revisions, studies } from './schema';
import { inTransaction, type SqlExecutor } from './transaction';
import { AppError } from '../errors';
import { assertId } from './revisions.repo';

export type RevisionScope = Awaited<ReturnType<typeof lockRevisionScope>>;

/**
 * The revision with its study and project, with the revision row locked until the caller's
 * transaction ends. Every write that depends on the revision's state, or that a workflow guard
 * reads, takes this lock first, so it is ordered strictly before or after each hand-off.
 */
export async function lockRevisionScope(tx: Database, revisionId: string) {
  assertId(revisionId, 'revision');
  const [row] = await tx
    .select({ revision: revisions, study: studies, project: projects })
    .from(revisions)
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .innerJoin(projects, eq(projects.id, studies.projectId))
    .where(eq(revisions.id, revisionId))
    .for('update', { of: revisions });
  if (!row) throw new AppError('NotFound', 'There is no revision with this id.');
  return row;
}

/** Runs `work` in one transaction that holds the revision's row lock from the start. */
export function withLockedRevision<T>(
  s: Pick<AppServices, 'pool'>,
  revisionId: string,
  work: (scope: RevisionScope, tx: Database, sqlExecutor: SqlExecutor) => Promise<T>,
): Promise<T> {
  return inTransaction(s.pool, async (tx, sqlExecutor) => work(await lockRevisionScope(tx, revisionId), tx, sqlExecutor));
}
