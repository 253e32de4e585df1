import { type Column, type Table, eq, sql } from 'drizzle-orm';
import { LRUCache } from 'lru-cache';
import { jsonBytes, rowJson, rowsJson } from './json-select';
import { cachedResultsBytes, rememberResultsBytes } from './results-bytes';
import { assertId } from './revisions.repo';
import type { Database } from './client';
import { perHandle } from './per-handle';
import { checkValues, checklistItems, projects, remarks, revisions, signOffs, studies, users } from './schema';
import { AppError } from '../errors';

/**
 * The revision screen's data (`revisionDetail`) as JSON bytes, with the project's id to authorise
 * before it is sent. The database writes every part as JSON and the server only joins the bytes.
 *
 * Whole answers are kept per revision and *stamp*: a digest of the `xmin` of every row the
 * answer is built from (the revision, its study and project, each checklist item, remark, check
 * value and sign-off, and the people named beside remarks and sign-offs). PostgreSQL gives a row a
 * new `xmin` whenever it is written, and a deleted row drops out of the list, so any write to what
 * the screen shows changes the stamp, whichever path made it: nothing has to remember to raise a
 * counter. The stamp is read from the database on every request, so each server process may keep
 * its own answers. Reading it touches only the rows' headers, where building the JSON of the
 * checklist and results was most of the database's work per request.
 */
const bodies = new LRUCache<string, Buffer>({ maxSize: 64 * 1024 * 1024, sizeCalculation: (bytes) => Math.max(1, bytes.length) });

const ofRevision = <T extends { revisionId: Column }>(t: T) => eq(t.revisionId, revisions.id);

/** The `xmin`s of a revision's rows in one table, in id order (with the named person's, where there is one). */
function xminsOf(table: Table & { id: Column; revisionId: Column }, person?: Column) {
  const tuple = person ? sql`${table}.xmin || ':' || ${users}.xmin` : sql`${table}.xmin::text`;
  const join = person ? sql`join ${users} on ${users.id} = ${person}` : sql``;
  return sql`(select string_agg(${tuple}, ',' order by ${table.id}) from ${table} ${join} where ${ofRevision(table)})`;
}

const stamp = sql<string>`md5(concat_ws('|', ${revisions}.xmin, ${studies}.xmin, ${projects}.xmin,
  ${xminsOf(checklistItems)}, ${xminsOf(remarks, remarks.authorId)}, ${xminsOf(checkValues)}, ${xminsOf(signOffs, signOffs.userId)}))`;

function stampQuery(db: Database) {
  return db
    .select({ projectId: projects.id, stamp })
    .from(revisions)
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .innerJoin(projects, eq(projects.id, studies.projectId))
    .where(eq(revisions.id, sql.placeholder('id')))
    .prepare('revision_detail_stamp');
}

/** Every part as JSON bytes, with the stamp of the same snapshot; the results only when asked for (else null). */
function partsQuery(db: Database, withResults: boolean) {
  return db
    .select({
      projectId: projects.id,
      version: revisions.version,
      stamp,
      revision: jsonBytes(rowJson(revisions, {}, ['results'])),
      study: jsonBytes(rowJson(studies)),
      project: jsonBytes(rowJson(projects)),
      checklist: jsonBytes(rowsJson(checklistItems, ofRevision(checklistItems), sql`${checklistItems.sortOrder}, ${checklistItems.id}`)),
      remarks: jsonBytes(rowsJson(remarks, ofRevision(remarks), sql`${remarks.createdAt}, ${remarks.id}`, { authorName: users.name }, sql`join ${users} on ${users.id} = ${remarks.authorId}`)),
      checkValues: jsonBytes(rowsJson(checkValues, ofRevision(checkValues), sql`${checkValues.createdAt}, ${checkValues.id}`)),
      signOffs: jsonBytes(rowsJson(signOffs, ofRevision(signOffs), sql`${signOffs.createdAt}, ${signOffs.id}`, { name: users.name }, sql`join ${users} on ${users.id} = ${signOffs.userId}`)),
      results: withResults ? sql<Buffer | null>`convert_to(${revisions.results}::text, 'UTF8')` : sql<Buffer | null>`null::bytea`,
    })
    .from(revisions)
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .innerJoin(projects, eq(projects.id, studies.projectId))
    .where(eq(revisions.id, sql.placeholder('id')))
    .prepare(withResults ? 'revision_detail_with_results' : 'revision_detail');
}

// Prepared once per database handle: building these statements cost more than running them.
const queries = perHandle((db) => ({ stamp: stampQuery(db), parts: partsQuery(db, false), withResults: partsQuery(db, true) }));

const NO_RESULTS = Buffer.from('null');
const notFound = () => new AppError('NotFound', 'There is no revision with this id.');

export async function revisionDetailBytes(db: Database, revisionId: string): Promise<{ projectId: string; body: Buffer }> {
  assertId(revisionId, 'revision');
  const q = queries(db);
  const [head] = await q.stamp.execute({ id: revisionId });
  if (!head) throw notFound();
  const kept = bodies.get(`${revisionId}:${head.stamp}`);
  if (kept) return { projectId: head.projectId, body: kept };

  let [row] = await q.parts.execute({ id: revisionId });
  if (!row) throw notFound();
  // Results change only with the version (see results-bytes), so they outlive a remark or an answer.
  let results = cachedResultsBytes(revisionId, row.version);
  if (!results) {
    [row] = await q.withResults.execute({ id: revisionId });
    if (!row) throw notFound();
    results = row.results ?? NO_RESULTS;
    rememberResultsBytes(revisionId, row.version, results);
  }
  const text = (t: string) => Buffer.from(t);
  const body = Buffer.concat([
    text('{"revision":'), row.revision.subarray(0, -1), text(',"results":'), results,
    text('},"study":'), row.study, text(',"project":'), row.project, text(',"checklist":'), row.checklist,
    text(',"remarks":'), row.remarks, text(',"checkValues":'), row.checkValues, text(',"signOffs":'), row.signOffs, text('}'),
  ]);
  // Kept under the stamp of the snapshot it was built from, which a write since may already have left behind.
  bodies.set(`${revisionId}:${row.stamp}`, body);
  return { projectId: row.projectId, body };
}
