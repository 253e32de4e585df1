import { asc, eq, sql } from 'drizzle-orm';
import type { Database } from '../db/client';
import { auditEvents, revisions, studies, users } from '../db/schema';
import { snapshotCache } from '../db/snapshot-cache';
import { perHandle } from '../db/per-handle';

/** A revision's events, oldest first, told with its number and study code; prepared once per database handle. */
function historyQuery(db: Database) {
  return db
    .select({ id: auditEvents.id, at: auditEvents.at, type: auditEvents.type, actorName: users.name, detail: auditEvents.detail, revisionNumber: revisions.number, studyCode: studies.code })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .innerJoin(revisions, eq(revisions.id, auditEvents.revisionId))
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .where(eq(auditEvents.revisionId, sql.placeholder('revisionId')))
    .orderBy(asc(auditEvents.id))
    .prepare('revision_history');
}
const prepared = perHandle(historyQuery);

const histories = snapshotCache<Awaited<ReturnType<ReturnType<typeof historyQuery>['execute']>>>(16 * 1024 * 1024);

/**
 * The revision's own history, for everyone who may read the revision (authorise first). Kept
 * until the database next changes (see snapshotCache): the history tab is opened far more often
 * than the revision moves.
 */
export function revisionHistory(db: Database, revisionId: string) {
  return histories(db, revisionId, () => prepared(db).execute({ revisionId }));
}
