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
export const revisionForCalculation = (db: Database, revisionId: string) => loadRevisionScopeWithResultsText(db, revisionId);

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
  return { ...scope, ...(await revisionParts(db, revisionId)) };
}

/**
 * A revision with its study and project for the revision screen, its results as the stored JSON
 * text: the API passes them through untouched (revisionDetailJson) instead of parsing and
 * re-serialising tens of kilobytes on every read.
 */
export async function loadRevisionScopeWithResultsText(db: Database, revisionId: string) {
  assertId(revisionId, 'revision');
  const { results: _results, ...columns } = getTableColumns(revisions);
  const [row] = await db
    .select({ revision: columns, study: studies, project: projects, resultsJson: sql<string | null>`${revisions.results}::text` })
    .from(revisions)
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .innerJoin(projects, eq(projects.id, studies.projectId))
    .where(eq(revisions.id, revisionId));
  if (!row) throw new AppError('NotFound', 'There is no revision with this id.');
  return row;
}

/** The JSON text of `revisionDetail` for a scope from loadRevisionScopeWithResultsText, results spliced in as stored. */
export async function revisionDetailJson(db: Database, scope: Awaited<ReturnType<typeof loadRevisionScopeWithResultsText>>): Promise<string> {
  const { revision, resultsJson, ...rest } = scope;
  const parts = await revisionParts(db, revision.id);
  const revisionText = JSON.stringify(revision);
  return `{"revision":${revisionText.slice(0, -1)},"results":${resultsJson ?? 'null'}},${JSON.stringify({ ...rest, ...parts }).slice(1)}`;
}

/** What a revision screen shows beside the revision itself: checklist, remarks, check values, sign-offs. */
async function revisionParts(db: Database, revisionId: string) {
  const [checklist, remarkRows, values, signatures] = await Promise.all([
    db.select().from(checklistItems).where(eq(checklistItems.revisionId, revisionId)).orderBy(asc(checklistItems.sortOrder)),
    db.select({ remark: remarks, authorName: users.name }).from(remarks).innerJoin(users, eq(users.id, remarks.authorId)).where(eq(remarks.revisionId, revisionId)).orderBy(asc(remarks.createdAt)),
    db.select().from(checkValues).where(eq(checkValues.revisionId, revisionId)).orderBy(asc(checkValues.createdAt)),
    db.select({ signOff: signOffs, name: users.name }).from(signOffs).innerJoin(users, eq(users.id, signOffs.userId)).where(eq(signOffs.revisionId, revisionId)).orderBy(asc(signOffs.createdAt)),
  ]);
  return {
    checklist,
    remarks: remarkRows.map((r) => ({ ...r.remark, authorName: r.authorName })),
    checkValues: values,
    signOffs: signatures.map((s) => ({ ...s.signOff, name: s.name })),
  };
}
