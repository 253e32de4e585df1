import { and, asc, desc, eq, getTableColumns, inArray, sql } from 'drizzle-orm';
import type { Database } from './client';
import { checkValues, checklistItems, limitSetVersions, memberships, projects, remarks, revisions, signOffs, studies, users } from './schema';
import { AppError } from '../errors';
import type { ProjectRole } from './schema/projects';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Throws NotFound for an id that cannot exist (PostgreSQL would reject it as malformed). */
export function assertId(id: string | undefined, what: string): string {
  if (!id || !UUID.test(id)) throw new AppError('NotFound', `There is no ${what} with this id.`);
  return id;
}

/**
 * A revision with its study and project, or NotFound. With `lock`, the revision row stays locked
 * until the caller's transaction ends (see `withLockedRevision`).
 */
export async function loadRevisionScope(db: Database, revisionId: string, { lock = false } = {}) {
  assertId(revisionId, 'revision');
  const query = db
    .select({ revision: revisions, study: studies, project: projects })
    .from(revisions)
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .innerJoin(projects, eq(projects.id, studies.projectId))
    .where(eq(revisions.id, revisionId));
  const [row] = await (lock ? query.for('update', { of: revisions }) : query);
  if (!row) throw new AppError('NotFound', 'There is no revision with this id.');
  return row;
}

/**
 * A revision and its study for a calculation: the results as JSON text (null before any
 * calculation), so that a worker thread parses them and the request thread never does.
 */
export async function revisionForCalculation(db: Database, revisionId: string) {
  assertId(revisionId, 'revision');
  const { results: _results, ...columns } = getTableColumns(revisions);
  const [row] = await db
    .select({ revision: columns, study: studies, resultsJson: sql<string | null>`${revisions.results}::text` })
    .from(revisions)
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .where(eq(revisions.id, revisionId));
  if (!row) throw new AppError('NotFound', 'There is no revision with this id.');
  return row;
}

export async function loadStudyScope(db: Database, studyId: string) {
  assertId(studyId, 'study');
  const [row] = await db.select({ study: studies, project: projects }).from(studies).innerJoin(projects, eq(projects.id, studies.projectId)).where(eq(studies.id, studyId));
  if (!row) throw new AppError('NotFound', 'There is no study with this id.');
  return row;
}

export async function latestLimitSetVersion(db: Database, limitSetId: string) {
  const [v] = await db.select().from(limitSetVersions).where(eq(limitSetVersions.limitSetId, limitSetId)).orderBy(desc(limitSetVersions.version)).limit(1);
  if (!v) throw new AppError('StepRefused', 'The study\'s limit set has no values yet: an administrator must publish a version.');
  return v;
}

export async function membersWithRole(db: Database, projectId: string, roles: ProjectRole[]) {
  return db
    .selectDistinct({ id: users.id, email: users.email, name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.projectId, projectId), inArray(memberships.role, roles)));
}

export async function userName(db: Database, id: string): Promise<string> {
  const [u] = await db.select({ name: users.name }).from(users).where(eq(users.id, id));
  return u?.name ?? 'someone';
}

/** Everything a revision screen or record shows. */
export async function revisionDetail(db: Database, revisionId: string) {
  const scope = await loadRevisionScope(db, revisionId);
  const [checklist, remarkRows, values, signatures, people] = await Promise.all([
    db.select().from(checklistItems).where(eq(checklistItems.revisionId, revisionId)).orderBy(asc(checklistItems.sortOrder)),
    db.select().from(remarks).where(eq(remarks.revisionId, revisionId)).orderBy(asc(remarks.createdAt)),
    db.select().from(checkValues).where(eq(checkValues.revisionId, revisionId)).orderBy(asc(checkValues.createdAt)),
    db.select().from(signOffs).where(eq(signOffs.revisionId, revisionId)).orderBy(asc(signOffs.createdAt)),
    db.select({ id: users.id, name: users.name }).from(users),
  ]);
  const nameOf = new Map(people.map((p) => [p.id, p.name]));
  return {
    ...scope,
    checklist,
    remarks: remarkRows.map((r) => ({ ...r, authorName: nameOf.get(r.authorId) ?? '' })),
    checkValues: values,
    signOffs: signatures.map((s) => ({ ...s, name: nameOf.get(s.userId) ?? '' })),
  };
}
