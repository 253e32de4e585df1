import { type Column, type SQL, and, asc, desc, eq, getTableColumns, inArray, sql } from 'drizzle-orm';
import type { Database } from './client';
import { checkValues, checklistItems, limitSetVersions, memberships, projects, recomputations, remarks, revisions, signOffs, studies, users } from './schema';
import { ENGINE_VERSION } from '../calc';
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
 * What a calculation decides on, in one read: the revision and its study, whether its results
 * are up to date (calculated from these inputs by this engine, with the study's latest limit set
 * version, and untouched since: `results_check` still hashes them), and the results hash a fresh
 * calculation of these inputs with this engine gave, if one is recorded. The results themselves
 * are read only when there is work to do (`storedResultsBytes`).
 */
export async function loadCalculationScope(db: Database, revisionId: string) {
  assertId(revisionId, 'revision');
  const { results: _results, ...columns } = getTableColumns(revisions);
  const latestLimitSetVersionId = sql`(select ${limitSetVersions.id} from ${limitSetVersions} where ${limitSetVersions.limitSetId} = ${studies.limitSetId} order by ${limitSetVersions.version} desc limit 1)`;
  const [row] = await db
    .select({
      revision: columns,
      study: studies,
      calculated: sql<boolean>`${revisions.results} is not null`,
      upToDate: sql<boolean>`coalesce(${revisions.resultsInputsHash} = ${revisions.inputsHash} and ${revisions.engineVersion} = ${ENGINE_VERSION}
        and ${revisions.limitSetVersionId} = ${latestLimitSetVersionId} and ${revisions.resultsCheck} = ${resultsCheckOf(revisions.results)}, false)`,
      knownResultsHash: sql<string | null>`(select ${recomputations.resultsHash} from ${recomputations} where ${recomputations.inputsHash} = ${revisions.inputsHash} and ${recomputations.engineVersion} = ${ENGINE_VERSION})`,
    })
    .from(revisions)
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .where(eq(revisions.id, revisionId));
  if (!row) throw new AppError('NotFound', 'There is no revision with this id.');
  return row;
}

/** PostgreSQL's hash of a jsonb value, as `revisions.results_check` keeps it. */
export const resultsCheckOf = (results: SQL | Column) => sql<string>`jsonb_hash_extended(${results}, 0)::text`;

/** A revision's stored results as JSON bytes (null before any calculation), read from the database. */
export async function storedResultsBytes(db: Database, revisionId: string): Promise<Buffer | null> {
  const [row] = await db.select({ bytes: sql<Buffer | null>`convert_to(${revisions.results}::text, 'UTF8')` }).from(revisions).where(eq(revisions.id, revisionId));
  return row?.bytes ?? null;
}
export type CalculationScope = Awaited<ReturnType<typeof loadCalculationScope>>;

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

/** What a revision screen shows beside the revision itself: checklist, remarks, check values, sign-offs. */
async function revisionParts(db: Database, revisionId: string) {
  const [checklist, remarkRows, values, signatures] = await Promise.all([
    db.select().from(checklistItems).where(eq(checklistItems.revisionId, revisionId)).orderBy(asc(checklistItems.sortOrder), asc(checklistItems.id)),
    db.select({ remark: remarks, authorName: users.name }).from(remarks).innerJoin(users, eq(users.id, remarks.authorId)).where(eq(remarks.revisionId, revisionId)).orderBy(asc(remarks.createdAt), asc(remarks.id)),
    db.select().from(checkValues).where(eq(checkValues.revisionId, revisionId)).orderBy(asc(checkValues.createdAt), asc(checkValues.id)),
    db.select({ signOff: signOffs, name: users.name }).from(signOffs).innerJoin(users, eq(users.id, signOffs.userId)).where(eq(signOffs.revisionId, revisionId)).orderBy(asc(signOffs.createdAt), asc(signOffs.id)),
  ]);
  return {
    checklist,
    remarks: remarkRows.map((r) => ({ ...r.remark, authorName: r.authorName })),
    checkValues: values,
    signOffs: signatures.map((s) => ({ ...s.signOff, name: s.name })),
  };
}
