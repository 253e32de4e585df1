import { randomUUID } from 'node:crypto';
import { and, asc, eq, isNull } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/client';
import { AppError } from '../errors';
import { assets, obligationRecords, obligationTypes, type ObligationCriterion } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import { assertId } from '../db/revisions.repo';
import { sha256Hex } from '../canonical-json';
import { detectContentType } from '../files/content-type';
import type { obligationRecordSchema, obligationTypeSchema } from '../schemas/register.schema';
import { loadAsset, loadLiveAsset, refuseRemoved } from './assets.service';
import { owedTypesOf, refreshStanding } from './obligation-standing';

export async function listObligationTypes(db: Database) {
  return db.select().from(obligationTypes).orderBy(asc(obligationTypes.ownerStandard), asc(obligationTypes.name));
}

/** Adds an obligation type to an owner standard; every asset under that standard owes it from now on. */
export async function addObligationType(s: AppServices, admin: SessionUser, body: z.output<typeof obligationTypeSchema>) {
  return inTransaction(s.pool, async (tx) => {
    const [type] = await tx.insert(obligationTypes).values({ ...body, createdBy: admin.id }).onConflictDoNothing().returning();
    if (!type) throw new AppError('InvalidInput', undefined, [{ field: 'name', message: `"${body.name}" already exists in ${body.ownerStandard}.` }]);
    const owing = await tx
      .select()
      .from(assets)
      .where(and(eq(assets.ownerStandard, type.ownerStandard), isNull(assets.removedAt), type.appliesTo === 'both' ? undefined : eq(assets.kind, type.appliesTo)));
    for (const asset of owing) await refreshStanding(tx, asset, [type.id]);
    await appendAudit(tx, { actorId: admin.id, type: 'obligation-type.added', detail: { ownerStandard: type.ownerStandard, name: type.name, firstDueMonths: type.firstDueMonths, intervalMonths: type.intervalMonths, criterion: type.criterion, basis: type.basis } });
    return type;
  });
}

/**
 * Pass when every value meets the criterion, fail when any does not; without a criterion the
 * record only says the work was done ("recorded"). A criterion with no value entered is refused.
 */
export function judge(criterion: ObligationCriterion | null, values: number[]): 'pass' | 'fail' | 'recorded' {
  if (!criterion) return 'recorded';
  const ok = (v: number) => (criterion.comparison === 'at-least' ? v >= criterion.limit : v <= criterion.limit);
  return values.every(ok) ? 'pass' : 'fail';
}

export interface Evidence {
  fileName: string;
  bytes: Uint8Array;
}

/**
 * Records an obligation done on an asset, judged against its criterion, with optional evidence
 * (stored through the object store first: a row never points at a missing object, and an object
 * whose row failed to commit is removed). The asset's next due date follows in the same
 * transaction, with the audit event.
 */
export async function recordObligation(s: AppServices, actor: SessionUser, assetId: string, body: z.output<typeof obligationRecordSchema>, evidence: Evidence | null, maxBytes: number) {
  const asset = refuseRemoved(await loadAsset(s.db, assetId));
  assertId(body.obligationTypeId, 'obligation type');
  const [type] = (await owedTypesOf(s.db, asset)).filter((t) => t.id === body.obligationTypeId);
  if (!type) throw new AppError('InvalidInput', undefined, [{ field: 'obligationTypeId', message: `This asset does not owe that obligation under ${asset.ownerStandard}.` }]);
  if (type.criterion && body.values.length === 0) throw new AppError('InvalidInput', undefined, [{ field: 'values', message: `Enter the measured ${type.criterion.quantity} (${type.criterion.unit}).` }]);
  if (body.doneOn > new Date().toISOString().slice(0, 10)) throw new AppError('InvalidInput', undefined, [{ field: 'doneOn', message: 'The work cannot be done in the future.' }]);
  let stored: { key: string; name: string; type: string; bytes: number; sha256: string } | null = null;
  if (evidence) {
    if (!s.store) throw new AppError('Unavailable', 'No file store is configured.');
    if (evidence.bytes.length === 0) throw new AppError('InvalidInput', undefined, [{ field: 'file', message: 'The file is empty.' }]);
    if (evidence.bytes.length > maxBytes) throw new AppError('TooLarge', undefined, [{ field: 'file', message: `The limit is ${(maxBytes / 1048576).toFixed(0)} MiB.` }]);
    const contentType = detectContentType(evidence.bytes);
    if (!contentType) throw new AppError('InvalidInput', undefined, [{ field: 'file', message: 'The content is not a PDF, PNG, JPEG, Office (zip) or CSV/text file, whatever its name says.' }]);
    stored = { key: `assets/${assetId}/${randomUUID()}`, name: evidence.fileName.replace(/[\u0000-\u001f\u007f]/g, '_').slice(0, 200), type: contentType, bytes: evidence.bytes.length, sha256: sha256Hex(evidence.bytes) };
    await s.store.put(stored.key, evidence.bytes, contentType);
  }
  const result = judge(type.criterion, body.values);
  try {
    return await inTransaction(s.pool, async (tx) => {
      // Again inside, locked: the asset may have been edited or removed while the file was stored.
      const live = await loadLiveAsset(tx, assetId);
      const [row] = await tx
        .insert(obligationRecords)
        .values({
          assetId,
          obligationTypeId: type.id,
          doneOn: body.doneOn,
          performedBy: body.performedBy,
          values: body.values,
          result,
          remarks: body.remarks,
          evidenceKey: stored?.key ?? null,
          evidenceName: stored?.name ?? null,
          evidenceType: stored?.type ?? null,
          evidenceBytes: stored?.bytes ?? null,
          evidenceSha256: stored?.sha256 ?? null,
          recordedBy: actor.id,
        })
        .returning();
      await refreshStanding(tx, live, [type.id]);
      await appendAudit(tx, {
        actorId: actor.id,
        type: 'obligation.recorded',
        projectId: asset.projectId,
        detail: { assetId, assetCode: asset.code, obligation: type.name, doneOn: body.doneOn, performedBy: body.performedBy, values: body.values, result, criterion: type.criterion, evidenceSha256: stored?.sha256 ?? null },
      });
      return { ...row, evidenceKey: undefined, hasEvidence: stored !== null };
    });
  } catch (err) {
    if (stored) await s.store?.delete(stored.key).catch(() => undefined);
    throw err;
  }
}

/** A record's evidence file, with the asset it belongs to (for authorisation). */
export async function loadEvidence(db: Database, recordId: string) {
  assertId(recordId, 'record');
  const [row] = await db.select().from(obligationRecords).where(eq(obligationRecords.id, recordId));
  if (!row || !row.evidenceKey) throw new AppError('NotFound', 'This record has no evidence file.');
  return row;
}

