import { eq } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { Database } from '../db/client';
import { issuedRecords } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import { sha256Hex } from '../canonical-json';
import { loadRevisionScope } from '../db/revisions.repo';
import { gatherRecordData } from './record-data';
import { renderRecord } from './record-document';

export const RECORD_QUEUE = 'record';

export const DOCX_TYPE = 'application/vnd.openxmlformats-officedocument.wordprocessingml.document';

const ISSUED = new Set(['issued', 'superseded']);

/** A record rendered now from the revision as it stands, marked as a draft unless issued. */
export async function renderCurrentRecord(db: Database, revisionId: string): Promise<Buffer> {
  return renderRecord(await gatherRecordData(db, revisionId));
}

/**
 * Renders and stores the issued record once (the job handler of the record queue): later calls
 * find it stored and do nothing, so a retried job cannot produce a second, different file.
 */
export async function storeIssuedRecord(s: Pick<AppServices, 'db' | 'pool'>, revisionId: string): Promise<void> {
  const { revision, study } = await loadRevisionScope(s.db, revisionId);
  if (!ISSUED.has(revision.state)) throw new Error(`revision ${revisionId} is ${revision.state}, not issued`);
  const [stored] = await s.db.select({ sha256: issuedRecords.sha256 }).from(issuedRecords).where(eq(issuedRecords.revisionId, revisionId));
  if (stored) return;
  const document = await renderCurrentRecord(s.db, revisionId);
  const sha256 = sha256Hex(document);
  await inTransaction(s.pool, async (tx) => {
    const inserted = await tx.insert(issuedRecords).values({ revisionId, document, sha256, sizeBytes: document.length }).onConflictDoNothing().returning({ sha256: issuedRecords.sha256 });
    if (inserted.length) {
      await appendAudit(tx, { actorId: null, type: 'record.issued', projectId: study.projectId, studyId: study.id, revisionId, detail: { sha256, sizeBytes: document.length } });
    }
  });
}

export type RecordDownload =
  | { kind: 'document'; document: Buffer; sha256: string; draft: boolean; fileName: string }
  | { kind: 'rendering' };

/** The issued record's stored bytes, a fresh draft, or word that the issued record is still being rendered. */
export async function recordForDownload(db: Database, revisionId: string): Promise<RecordDownload> {
  const { revision, study } = await loadRevisionScope(db, revisionId);
  const fileName = `${study.code}-rev${revision.number}${ISSUED.has(revision.state) ? '' : '-DRAFT'}.docx`;
  if (ISSUED.has(revision.state)) {
    const [stored] = await db.select().from(issuedRecords).where(eq(issuedRecords.revisionId, revisionId));
    if (!stored) return { kind: 'rendering' };
    return { kind: 'document', document: stored.document, sha256: stored.sha256, draft: false, fileName };
  }
  const document = await renderCurrentRecord(db, revisionId);
  return { kind: 'document', document, sha256: sha256Hex(document), draft: true, fileName };
}
