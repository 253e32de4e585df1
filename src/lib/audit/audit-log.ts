import { type Column, type Table, aliasedTable, and, asc, desc, eq, gte, inArray, lte, sql, type SQL } from 'drizzle-orm';
import type { Database } from '../db/client';
import { perHandle } from '../db/per-handle';
import { auditEvents, projects, revisions, studies, users, type AuditEvent } from '../db/schema';
import { eventSentence } from '../records/event-sentences';
import { canonicalJson, sha256Hex } from '../canonical-json';
import { toCsv } from '../csv/csv-text';
import { scopeCondition, scopeConditionOf, type AuditScope } from './audit-scope';
import { snapshotCache } from '../db/snapshot-cache';

/** The previous hash of the first event. */
export const GENESIS = 'genesis';
// Appends take this transaction-scoped lock so that two writers cannot both chain onto the same
// previous event.
const CHAIN_LOCK = 7_270_001;

export interface AuditEntry {
  actorId: string | null;
  type: string;
  projectId?: string | null;
  studyId?: string | null;
  revisionId?: string | null;
  detail: Record<string, unknown>;
}

export type SealedFields = Omit<AuditEvent, 'id' | 'hash'>;

/** The hash over every stored field but the row id and the hash itself. */
export function eventHash(e: SealedFields): string {
  const { at, actorId, type, projectId, studyId, revisionId, detail, prevHash } = e;
  return sha256Hex(canonicalJson({ at: at.getTime(), actorId, type, projectId, studyId, revisionId, detail, prevHash }));
}

/** Appends an event to the chain inside the caller's transaction. */
export async function appendAudit(tx: Database, entry: AuditEntry): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(${CHAIN_LOCK})`);
  const [last] = await tx.select({ hash: auditEvents.hash }).from(auditEvents).orderBy(desc(auditEvents.id)).limit(1);
  const fields: SealedFields = {
    at: new Date(),
    actorId: entry.actorId,
    type: entry.type,
    projectId: entry.projectId ?? null,
    studyId: entry.studyId ?? null,
    revisionId: entry.revisionId ?? null,
    detail: entry.detail,
    prevHash: last?.hash ?? GENESIS,
  };
  await tx.insert(auditEvents).values({ ...fields, hash: eventHash(fields) });
}

export interface AuditFilter {
  projectId?: string;
  studyId?: string;
  revisionId?: string;
  /** A study code as people know it (B10), any case; in several projects it matches each. */
  studyCode?: string;
  /** A revision number; with a study code, that study's revision, else that number of any study. */
  revisionNumber?: number;
  actorId?: string;
  type?: string;
  from?: Date;
  to?: Date;
}

function whereOf(scope: AuditScope, f: AuditFilter): SQL | undefined {
  const codeMatches = f.studyCode ? sql`lower(${studies.code}) = lower(${f.studyCode})` : undefined;
  return and(
    scopeCondition(scope),
    f.projectId ? eq(auditEvents.projectId, f.projectId) : undefined,
    f.studyId ? eq(auditEvents.studyId, f.studyId) : undefined,
    f.revisionId ? eq(auditEvents.revisionId, f.revisionId) : undefined,
    f.studyCode ? inArray(auditEvents.studyId, sql`(select ${studies.id} from ${studies} where ${codeMatches})`) : undefined,
    f.revisionNumber !== undefined
      ? inArray(
          auditEvents.revisionId,
          sql`(select ${revisions.id} from ${revisions} join ${studies} on ${studies.id} = ${revisions.studyId} where ${revisions.number} = ${f.revisionNumber}${codeMatches ? sql` and ${codeMatches}` : sql``})`,
        )
      : undefined,
    f.actorId ? eq(auditEvents.actorId, f.actorId) : undefined,
    f.type ? eq(auditEvents.type, f.type) : undefined,
    f.from ? gte(auditEvents.at, f.from) : undefined,
    f.to ? lte(auditEvents.at, f.to) : undefined,
  );
}

const eventStudy = aliasedTable(studies, 'event_study');
const eventRevision = aliasedTable(revisions, 'event_revision');

/** A column of the row another table's id names, as a scalar subquery (null when the id is). */
const nameOf = <T>(column: Column, table: Table, id: Column, ref: Column) => sql<T | null>`(select ${column} from ${table} where ${id} = ${ref})`;

/**
 * The events with the names people know them by: who, which project, study code, revision number.
 * For a page, the names come from scalar subqueries: with four outer joins PostgreSQL spent 1-3 ms
 * planning each page, most of what a page cost, to name twenty rows. A whole export (`many`) joins.
 */
function namedEvents(db: Database, many = false) {
  if (!many) {
    return db
      .select({
        event: auditEvents,
        actorName: nameOf<string>(users.name, users, users.id, auditEvents.actorId),
        projectCode: nameOf<string>(projects.code, projects, projects.id, auditEvents.projectId),
        projectName: nameOf<string>(projects.name, projects, projects.id, auditEvents.projectId),
        studyCode: nameOf<string>(studies.code, studies, studies.id, auditEvents.studyId),
        revisionNumber: nameOf<number>(revisions.number, revisions, revisions.id, auditEvents.revisionId),
      })
      .from(auditEvents)
      .$dynamic();
  }
  return db
    .select({
      event: auditEvents,
      actorName: users.name,
      projectCode: projects.code,
      projectName: projects.name,
      studyCode: eventStudy.code,
      revisionNumber: eventRevision.number,
    })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .leftJoin(projects, eq(projects.id, auditEvents.projectId))
    .leftJoin(eventStudy, eq(eventStudy.id, auditEvents.studyId))
    .leftJoin(eventRevision, eq(eventRevision.id, auditEvents.revisionId))
    .$dynamic();
}

type NamedRow = Awaited<ReturnType<ReturnType<typeof namedEvents>['where']>>[number];

const flatten = (r: NamedRow) => {
  const named = { actorName: r.actorName, projectCode: r.projectCode, projectName: r.projectName, studyCode: r.studyCode, revisionNumber: r.revisionNumber };
  return { ...r.event, ...named, sentence: eventSentence({ type: r.event.type, detail: r.event.detail, ...named }) };
};

/**
 * The audit screen's opening view (no filter) for a scoped reader and for an administrator,
 * prepared once per database handle: neither Drizzle nor PostgreSQL parses them again. PostgreSQL
 * still plans each call (its generic plans for these are bad; see DEVELOPERS.md, Planning).
 */
function unfilteredQueries(db: Database) {
  const build = (where: SQL | undefined, name: string) => ({
    count: db.select({ total: sql<number>`count(*)::int` }).from(auditEvents).where(where).prepare(`audit_count_${name}`),
    page: namedEvents(db).where(where).orderBy(desc(auditEvents.id)).limit(sql.placeholder('limit')).offset(sql.placeholder('offset')).prepare(`audit_page_${name}`),
  });
  return { all: build(undefined, 'all'), scoped: build(scopeConditionOf(sql.placeholder('projects')), 'scoped') };
}
const unfiltered = perHandle(unfilteredQueries);

const pages = snapshotCache<Awaited<ReturnType<typeof readAuditPage>>>(32 * 1024 * 1024);

/**
 * A page of the events in scope, newest first. Kept until the database next changes (see
 * snapshotCache): the trail only grows when something is written, and auditors page back and forth.
 */
export function listAuditEvents(db: Database, scope: AuditScope, filter: AuditFilter, page: number, pageSize: number) {
  return pages(db, JSON.stringify([scope, filter, page, pageSize]), () => readAuditPage(db, scope, filter, page, pageSize));
}

async function readAuditPage(db: Database, scope: AuditScope, filter: AuditFilter, page: number, pageSize: number) {
  if (Object.values(filter).every((v) => v === undefined)) {
    const q = unfiltered(db);
    const { count, page: rows } = scope.all ? q.all : q.scoped;
    const params = { projects: scope.all ? [] : scope.projectIds, limit: pageSize, offset: page * pageSize };
    const [[{ total }], events] = await Promise.all([count.execute(params), rows.execute(params)]);
    return { total, events: events.map(flatten) };
  }
  const where = whereOf(scope, filter);
  const [[{ total }], rows] = await Promise.all([
    db.select({ total: sql<number>`count(*)::int` }).from(auditEvents).where(where),
    namedEvents(db).where(where).orderBy(desc(auditEvents.id)).limit(pageSize).offset(page * pageSize),
  ]);
  return { total, events: rows.map(flatten) };
}

const facets = snapshotCache<{ people: Array<{ id: string; name: string }>; types: string[] }>(4 * 1024 * 1024);

/**
 * The people and event types in scope, for the filters. Both scan every event in scope (100,000
 * for an administrator), so they are kept until the database next changes (see snapshotCache).
 */
export function auditFacets(db: Database, scope: AuditScope) {
  return facets(db, JSON.stringify(scope), async () => {
    const [people, types] = await Promise.all([auditActors(db, scope), auditTypes(db, scope)]);
    return { people, types };
  });
}

/** The people who appear in the events in scope, for the person filter. */
async function auditActors(db: Database, scope: AuditScope) {
  return db
    .selectDistinct({ id: users.id, name: users.name })
    .from(auditEvents)
    .innerJoin(users, eq(users.id, auditEvents.actorId))
    .where(scopeCondition(scope))
    .orderBy(users.name);
}

/** The event types that appear in the events in scope, for the type filter. */
async function auditTypes(db: Database, scope: AuditScope): Promise<string[]> {
  return (await db.selectDistinct({ type: auditEvents.type }).from(auditEvents).where(scopeCondition(scope)).orderBy(auditEvents.type)).map((r) => r.type);
}

const CSV_COLUMNS = [
  'id', 'at', 'actor_id', 'actor_name', 'type', 'event', 'project_id', 'project_code', 'project_name',
  'study_id', 'study_code', 'revision_id', 'revision_number', 'detail', 'prev_hash', 'hash',
] as const;

/** Every matching event in scope as CSV, oldest first: ids with names and codes beside them, and the event as a sentence. */
export async function exportAuditCsv(db: Database, scope: AuditScope, filter: AuditFilter): Promise<string> {
  const rows = (await namedEvents(db, true).where(whereOf(scope, filter)).orderBy(asc(auditEvents.id))).map(flatten);
  return toCsv(
    CSV_COLUMNS,
    rows.map((r) => [r.id, r.at.toISOString(), r.actorId, r.actorName, r.type, r.sentence, r.projectId, r.projectCode, r.projectName, r.studyId, r.studyCode, r.revisionId, r.revisionNumber, r.detail, r.prevHash, r.hash]),
  );
}
