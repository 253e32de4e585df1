import type { Database } from '../db/client';
import { eq } from 'drizzle-orm';
import { LRUCache } from 'lru-cache';
import { assertId, loadStudyScope } from '../db/revisions.repo';
import { revisions, studies } from '../db/schema';
import { AppError } from '../errors';
import type { ProjectRole } from '../db/schema/projects';

/** Roles that may read a project's studies. */
export const READERS: ProjectRole[] = ['designer', 'checker', 'approver', 'auditor'];
/** Roles that take part in the work (everyone but the auditor). */
export const PARTICIPANTS: ProjectRole[] = ['designer', 'checker', 'approver'];

/**
 * Which project each revision belongs to, as read once. Nothing moves a revision to another
 * study or a study to another project, so an answer never goes out of date; authorising a request
 * about a revision then costs no query. (Whether the revision still exists is for the service to
 * find: every one reads it.)
 */
const revisionProjects = new LRUCache<string, string>({ max: 50_000 });

/** The project of a revision (NotFound if none): reads two small columns, never the revision's inputs or results. */
export async function projectOfRevision(db: Database, revisionId: string): Promise<string> {
  assertId(revisionId, 'revision');
  const known = revisionProjects.get(revisionId);
  if (known) return known;
  const [row] = await db.select({ projectId: studies.projectId }).from(revisions).innerJoin(studies, eq(studies.id, revisions.studyId)).where(eq(revisions.id, revisionId));
  if (!row) throw new AppError('NotFound', 'There is no revision with this id.');
  revisionProjects.set(revisionId, row.projectId);
  return row.projectId;
}
export const projectOfStudy = async (db: Database, studyId: string) => (await loadStudyScope(db, studyId)).project.id;
