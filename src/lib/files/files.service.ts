import { randomUUID } from 'node:crypto';
import { and, asc, eq, lt } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/client';
import { AppError } from '../errors';
import { revisionFiles } from '../db/schema';
import { withLockedRevision } from '../db/revision-lock';
import { appendAudit } from '../audit/audit-log';
import { sha256Hex } from '../canonical-json';
import { loadRevisionScope } from '../db/revisions.repo';
import { parseStudyInputs } from '../studies/study-input';
import type { BondingResults } from '../calc/bonding/results';
import type { BondingStudy } from '../schemas/bonding-study.schema';
import { detectContentType } from './content-type';
import { compareMeasurements, parseMeasurements } from './measurements';

const CLOSED = new Set(['issued', 'withdrawn', 'superseded']);
export type FileKind = 'data-sheet' | 'drawing' | 'measurements' | 'other';

/**
 * Stores an upload after checking its size and, by content, its type; measurements must also
 * parse. The row is written first as pending, under the revision's lock, then the bytes go to
 * the object store, then the row is marked stored under the lock again: a revision that closed
 * meanwhile gets nothing (row and object removed), and a crash leaves only a pending row that
 * `sweepPendingUploads` clears with its object.
 */
export async function uploadFile(s: AppServices, actor: SessionUser, revisionId: string, upload: { kind: FileKind; fileName: string; bytes: Uint8Array }, maxBytes: number) {
  const store = s.store;
  if (!store) throw new AppError('Unavailable', 'No file store is configured.');
  const field = (message: string) => new AppError('InvalidInput', undefined, [{ field: 'file', message }]);
  if (upload.bytes.length === 0) throw field('The file is empty.');
  if (upload.bytes.length > maxBytes) throw new AppError('TooLarge', undefined, [{ field: 'file', message: `The file is ${(upload.bytes.length / 1048576).toFixed(1)} MiB; the limit is ${(maxBytes / 1048576).toFixed(0)} MiB.` }]);
  const contentType = detectContentType(upload.bytes);
  if (!contentType) throw field('The content is not a PDF, PNG, JPEG, Office (zip) or CSV/text file, whatever its name says.');
  if (upload.kind === 'measurements') {
    if (contentType !== 'text/csv') throw field('Commissioning measurements must be a CSV file.');
    const parsed = parseMeasurements(new TextDecoder().decode(upload.bytes));
    if ('errors' in parsed) throw new AppError('InvalidInput', 'The measurement file needs correcting.', parsed.errors.map((message) => ({ field: 'file', message })));
  }
  const assertOpen = (state: string) => {
    if (CLOSED.has(state)) throw new AppError('ReadOnly', 'This revision is closed: attach files to a new revision.');
  };
  const storageKey = `revisions/${revisionId}/${randomUUID()}`;
  const pending = await withLockedRevision(s, revisionId, async ({ revision }, tx) => {
    assertOpen(revision.state);
    const [row] = await tx
      .insert(revisionFiles)
      .values({ revisionId, kind: upload.kind, fileName: upload.fileName.replace(/[\u0000-\u001f\u007f]/g, '_').slice(0, 200), contentType, sizeBytes: upload.bytes.length, sha256: sha256Hex(upload.bytes), storageKey, uploadedBy: actor.id, status: 'pending' })
      .returning();
    return row;
  });
  await store.put(storageKey, upload.bytes, contentType);
  try {
    return await withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
      assertOpen(revision.state);
      const [row] = await tx.update(revisionFiles).set({ status: 'stored' }).where(eq(revisionFiles.id, pending.id)).returning();
      await appendAudit(tx, { actorId: actor.id, type: 'file.uploaded', projectId: study.projectId, studyId: study.id, revisionId, detail: { fileId: row.id, fileName: row.fileName, kind: row.kind, contentType, sizeBytes: row.sizeBytes, sha256: row.sha256 } });
      return row;
    });
  } catch (err) {
    await discardUpload(s, pending).catch(() => undefined);
    throw err;
  }
}

async function discardUpload(s: AppServices, file: { id: string; storageKey: string }) {
  await s.store?.delete(file.storageKey);
  await s.db.delete(revisionFiles).where(and(eq(revisionFiles.id, file.id), eq(revisionFiles.status, 'pending')));
}

/** Removes uploads left pending (by a crash or an outage) for longer than `olderThanMs`, object and row. */
export async function sweepPendingUploads(s: AppServices, olderThanMs = 60 * 60 * 1000): Promise<number> {
  const stale = await s.db
    .select({ id: revisionFiles.id, storageKey: revisionFiles.storageKey })
    .from(revisionFiles)
    .where(and(eq(revisionFiles.status, 'pending'), lt(revisionFiles.createdAt, new Date(Date.now() - olderThanMs))));
  for (const file of stale) await discardUpload(s, file);
  return stale.length;
}

export async function listFiles(db: Database, revisionId: string) {
  return db.select().from(revisionFiles).where(and(eq(revisionFiles.revisionId, revisionId), eq(revisionFiles.status, 'stored'))).orderBy(asc(revisionFiles.createdAt));
}

export async function loadFile(db: Database, fileId: string) {
  const [row] = await db.select().from(revisionFiles).where(and(eq(revisionFiles.id, fileId), eq(revisionFiles.status, 'stored')));
  if (!row) throw new AppError('NotFound', 'There is no file with this id.');
  return row;
}

/** A measurement file set beside the revision's calculation, scaled to the measured load. */
export async function measurementComparison(s: AppServices, fileId: string) {
  const file = await loadFile(s.db, fileId);
  if (file.kind !== 'measurements') throw new AppError('InvalidInput', 'Only commissioning measurement files can be compared.');
  const { revision, study } = await loadRevisionScope(s.db, file.revisionId);
  if (study.kind !== 'bonding' || !revision.results) throw new AppError('StepRefused', 'Calculate the revision first: there is nothing to compare the readings with.');
  const parsed = parseMeasurements(new TextDecoder().decode(await s.store!.get(file.storageKey)));
  if ('errors' in parsed) throw new AppError('InvalidInput', parsed.errors[0]);
  return compareMeasurements(parseStudyInputs(revision.inputs, 'bonding') as BondingStudy, revision.results as BondingResults, parsed.rows);
}
