import { and, eq, inArray, isNull } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { Database } from '../db/client';
import { auditEvents, issuedRecords, recordFailures, revisions } from '../db/schema';
import { inTransaction, type SqlExecutor } from '../db/transaction';
import type { JobQueue } from '../jobs/job-queue';
import { appendAudit } from '../audit/audit-log';
import { sha256Hex } from '../canonical-json';
import { loadRevisionScope, membersWithRole } from '../db/revisions.repo';
import { databaseAppError } from '../db/database-errors';
import { withLockedRevision } from '../db/revision-lock';
import { AppError } from '../errors';
import { MAIL_QUEUE } from '../mail/mail-delivery';
import { recordFailedMessage } from '../mail/workflow-messages';
import { gatherRecordData, recordDocumentNumber } from './record-data';
import type { ObjectStore } from '../storage/object-store';
import { compute } from '../compute/compute-pool';

export const RECORD_QUEUE = 'record';

export const DOCX_TYPE = 'application/vnd.openxmlformats-officedocument.wordprocessingml.document';

// A record renders in about a second; a job still running after this died with its server.
const RECORD_JOB_EXPIRY_SECONDS = 60;

/** Queues the rendering of issued records, inside the caller's transaction. */
export function enqueueRecords(jobs: JobQueue | null | undefined, sqlExecutor: SqlExecutor, revisionIds: string[]): Promise<void> {
  return jobs ? jobs.enqueue(sqlExecutor, RECORD_QUEUE, revisionIds.map((revisionId) => ({ revisionId })), { expireInSeconds: RECORD_JOB_EXPIRY_SECONDS }) : Promise.resolve();
}

const ISSUED = ['issued', 'superseded'] as const;
const isIssued = (state: string) => (ISSUED as readonly string[]).includes(state);

/** A record rendered now (in a worker thread) from the revision as it stands, marked as a draft unless issued. */
export async function renderCurrentRecord(db: Database, revisionId: string, store?: ObjectStore | null, appUrl?: string): Promise<Buffer> {
  const bytes = await compute({ task: 'record', data: await gatherRecordData(db, revisionId, store, appUrl) });
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

/**
 * Renders and stores the issued record once (the job handler of the record queue): later calls
 * find it stored and do nothing, so a retried job cannot produce a second, different file.
 * An outage (the database) is thrown, so the job is retried; a fault in rendering itself would
 * fail the same way every time, so it is recorded instead, the approvers are told, and the job
 * ends (a person retries it after the cause is fixed).
 */
export async function storeIssuedRecord(s: Pick<AppServices, 'db' | 'pool'> & Partial<Pick<AppServices, 'jobs' | 'appUrl' | 'store'>>, revisionId: string): Promise<void> {
  const scope = await loadRevisionScope(s.db, revisionId);
  const { revision, study, project } = scope;
  if (!isIssued(revision.state)) throw new Error(`revision ${revisionId} is ${revision.state}, not issued`);
  const [stored] = await s.db.select({ sha256: issuedRecords.sha256 }).from(issuedRecords).where(eq(issuedRecords.revisionId, revisionId));
  if (stored) return;
  let document: Buffer;
  try {
    document = await renderCurrentRecord(s.db, revisionId, s.store, s.appUrl);
  } catch (err) {
    if (databaseAppError(err)?.errorName === 'Unavailable') throw err;
    const error = (err as Error).message?.slice(0, 1000) || String(err);
    console.error(`[records] rendering the record of revision ${revisionId} failed:`, err);
    await inTransaction(s.pool, async (tx, sqlExecutor) => {
      const inserted = await tx.insert(recordFailures).values({ revisionId, error }).onConflictDoNothing().returning();
      if (!inserted.length) return;
      await appendAudit(tx, { actorId: null, type: 'record.failed', projectId: study.projectId, studyId: study.id, revisionId, detail: { error } });
      if (s.jobs && s.appUrl) {
        const approvers = await membersWithRole(tx, project.id, ['approver']);
        const c = { appUrl: s.appUrl, projectName: project.name, studyTitle: study.title, revisionNumber: revision.number, revisionId, actorName: 'Sheathwise', reason: error };
        await s.jobs.enqueue(sqlExecutor, MAIL_QUEUE, approvers.map((p) => recordFailedMessage(c, p.email)));
      }
    });
    return;
  }
  const sha256 = sha256Hex(document);
  await inTransaction(s.pool, async (tx) => {
    const inserted = await tx.insert(issuedRecords).values({ revisionId, document, sha256, sizeBytes: document.length }).onConflictDoNothing().returning({ sha256: issuedRecords.sha256 });
    if (inserted.length) {
      await appendAudit(tx, { actorId: null, type: 'record.issued', projectId: study.projectId, studyId: study.id, revisionId, detail: { documentNumber: await recordDocumentNumber(tx, scope), sha256, sizeBytes: document.length } });
    }
  });
}

/**
 * Queues the record of every issued revision that has neither a record nor a recorded failure:
 * run when the workers start, so a server that died while rendering finishes the job within a
 * minute of coming back instead of waiting for the old job to expire. Storing is idempotent,
 * so a job that also survives does no harm.
 */
export async function resumeIssuedRecords(s: Pick<AppServices, 'pool' | 'jobs'>): Promise<number> {
  return inTransaction(s.pool, async (tx, sqlExecutor) => {
    const missing = await tx
      .select({ revisionId: revisions.id })
      .from(revisions)
      .leftJoin(issuedRecords, eq(issuedRecords.revisionId, revisions.id))
      .leftJoin(recordFailures, eq(recordFailures.revisionId, revisions.id))
      .where(and(inArray(revisions.state, [...ISSUED]), isNull(issuedRecords.revisionId), isNull(recordFailures.revisionId)));
    await enqueueRecords(s.jobs, sqlExecutor, missing.map((m) => m.revisionId));
    return missing.length;
  });
}

/** Clears a recorded failure and queues the rendering again (an approver, after fixing the cause). */
export async function retryIssuedRecord(s: AppServices, actor: { id: string }, revisionId: string): Promise<void> {
  await withLockedRevision(s, revisionId, async ({ revision, study }, tx, sqlExecutor) => {
    if (!isIssued(revision.state)) throw new AppError('StepRefused', 'Only an issued revision has a record to render again.');
    const cleared = await tx.delete(recordFailures).where(eq(recordFailures.revisionId, revisionId)).returning();
    if (!cleared.length) throw new AppError('StepRefused', 'The record of this revision has not failed: there is nothing to retry.');
    await appendAudit(tx, { actorId: actor.id, type: 'record.retried', projectId: study.projectId, studyId: study.id, revisionId, detail: { previousError: cleared[0].error } });
    await enqueueRecords(s.jobs, sqlExecutor, [revisionId]);
  });
}

export type RecordDownload =
  | { kind: 'document'; document: Buffer; sha256: string; draft: boolean; fileName: string }
  | { kind: 'rendering' }
  | { kind: 'failed'; error: string };

/** The issued record's stored bytes, a fresh draft, or word that the issued record is still being rendered or failed. */
export async function recordForDownload(db: Database, revisionId: string, store?: ObjectStore | null, appUrl?: string): Promise<RecordDownload> {
  const scope = await loadRevisionScope(db, revisionId);
  const { revision } = scope;
  if (isIssued(revision.state)) {
    const [stored] = await db.select().from(issuedRecords).where(eq(issuedRecords.revisionId, revisionId));
    // Named by the number it was issued with (the audit event keeps it), whatever the pattern is now.
    const [issuedEvent] = stored ? await db.select({ detail: auditEvents.detail }).from(auditEvents).where(and(eq(auditEvents.revisionId, revisionId), eq(auditEvents.type, 'record.issued'))).limit(1) : [];
    const issuedNumber = (issuedEvent?.detail as { documentNumber?: unknown } | undefined)?.documentNumber;
    const fileName = `${typeof issuedNumber === 'string' ? issuedNumber : await recordDocumentNumber(db, scope)}.docx`;
    if (stored) return { kind: 'document', document: stored.document, sha256: stored.sha256, draft: false, fileName };
    const [failure] = await db.select().from(recordFailures).where(eq(recordFailures.revisionId, revisionId));
    return failure ? { kind: 'failed', error: failure.error } : { kind: 'rendering' };
  }
  const document = await renderCurrentRecord(db, revisionId, store, appUrl);
  // Named by its document number, so the file and the number on its pages agree.
  return { kind: 'document', document, sha256: sha256Hex(document), draft: true, fileName: `${await recordDocumentNumber(db, scope)}-DRAFT.docx` };
}
