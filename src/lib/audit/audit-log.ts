import { and, asc, desc, eq, gte, lte, sql, type SQL } from 'drizzle-orm';
import type { Database } from '../db/client';
import { auditEvents, users, type AuditEvent } from '../db/schema';
import { canonicalJson, sha256Hex } from '../canonical-json';

const GENESIS = 'genesis';
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

type SealedFields = Omit<AuditEvent, 'id' | 'hash'>;

/** The hash over every stored field but the row id and the hash itself. */
function eventHash(e: SealedFields): string {
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

export interface ChainReport {
  ok: boolean;
  checked: number;
  firstBroken?: { id: number; reason: string };
}

/** Recomputes the chain from the first event; reports the first event whose link or content does not match. */
export async function verifyAuditChain(db: Database): Promise<ChainReport> {
  const rows = await db.select().from(auditEvents).orderBy(asc(auditEvents.id));
  let prev = GENESIS;
  for (const [i, row] of rows.entries()) {
    if (row.prevHash !== prev) {
      return { ok: false, checked: i, firstBroken: { id: row.id, reason: 'it does not point at the event before it (an event was removed or reordered)' } };
    }
    const expected = eventHash(row);
    if (row.hash !== expected) {
      return { ok: false, checked: i, firstBroken: { id: row.id, reason: 'its content no longer matches its hash (the event was changed)' } };
    }
    prev = row.hash;
  }
  return { ok: true, checked: rows.length };
}

export interface AuditFilter {
  projectId?: string;
  studyId?: string;
  revisionId?: string;
  actorId?: string;
  type?: string;
  from?: Date;
  to?: Date;
}

function whereOf(f: AuditFilter): SQL | undefined {
  return and(
    f.projectId ? eq(auditEvents.projectId, f.projectId) : undefined,
    f.studyId ? eq(auditEvents.studyId, f.studyId) : undefined,
    f.revisionId ? eq(auditEvents.revisionId, f.revisionId) : undefined,
    f.actorId ? eq(auditEvents.actorId, f.actorId) : undefined,
    f.type ? eq(auditEvents.type, f.type) : undefined,
    f.from ? gte(auditEvents.at, f.from) : undefined,
    f.to ? lte(auditEvents.at, f.to) : undefined,
  );
}

/** A page of events, newest first. */
export async function listAuditEvents(db: Database, filter: AuditFilter, page: number, pageSize: number) {
  const where = whereOf(filter);
  const [{ total }] = await db.select({ total: sql<number>`count(*)::int` }).from(auditEvents).where(where);
  const rows = await db
    .select({ event: auditEvents, actorName: users.name })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(where)
    .orderBy(desc(auditEvents.id))
    .limit(pageSize)
    .offset(page * pageSize);
  return { total, events: rows.map((r) => ({ ...r.event, actorName: r.actorName })) };
}

/** The people who appear in the trail, for the person filter. */
export async function auditActors(db: Database) {
  return db.selectDistinct({ id: users.id, name: users.name }).from(auditEvents).innerJoin(users, eq(users.id, auditEvents.actorId)).orderBy(users.name);
}

/** The event types that appear in the trail, for the type filter. */
export async function auditTypes(db: Database): Promise<string[]> {
  return (await db.selectDistinct({ type: auditEvents.type }).from(auditEvents).orderBy(auditEvents.type)).map((r) => r.type);
}

/** Every matching event as CSV, oldest first (RFC 4180 quoting). */
export async function exportAuditCsv(db: Database, filter: AuditFilter): Promise<string> {
  const rows = await db.select().from(auditEvents).where(whereOf(filter)).orderBy(asc(auditEvents.id));
  const header = ['id', 'at', 'actor_id', 'type', 'project_id', 'study_id', 'revision_id', 'detail', 'prev_hash', 'hash'];
  const cell = (v: unknown) => {
    const s = v === null || v === undefined ? '' : typeof v === 'string' ? v : JSON.stringify(v);
    return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
  };
  const line = (r: AuditEvent) =>
    [r.id, r.at.toISOString(), r.actorId, r.type, r.projectId, r.studyId, r.revisionId, r.detail, r.prevHash, r.hash].map(cell).join(',');
  return [header.join(','), ...rows.map(line)].join('\r\n') + '\r\n';
}
