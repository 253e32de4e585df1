import { and, asc, desc, eq } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/client';
import { AppError } from '../errors';
import { assetObligations, assets, obligationRecords, obligationTypes, siteSystemData, studies, studyAssets, studySummaries, users } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import { assertId } from '../db/revisions.repo';
import type { newAssetSchema, studyLinkSchema } from '../schemas/register.schema';
import { refreshStanding } from './obligation-standing';

/** An asset, or NotFound. */
export async function loadAsset(db: Database, assetId: string) {
  assertId(assetId, 'asset');
  const [asset] = await db.select().from(assets).where(eq(assets.id, assetId));
  if (!asset) throw new AppError('NotFound', 'There is no asset with this id.');
  return asset;
}

export const projectOfAsset = async (db: Database, assetId: string) => (await loadAsset(db, assetId)).projectId;

/** Adds a circuit or site to a project, owing every obligation its owner standard sets. */
export async function createAsset(s: AppServices, actor: SessionUser, projectId: string, body: z.output<typeof newAssetSchema>) {
  return inTransaction(s.pool, async (tx) => {
    const [asset] = await tx
      .insert(assets)
      .values({ projectId, kind: body.kind, siteKind: body.kind === 'site' ? body.siteKind : null, code: body.code, name: body.name, route: body.route, ownerStandard: body.ownerStandard, inServiceOn: body.inServiceOn, createdBy: actor.id })
      .onConflictDoNothing()
      .returning();
    if (!asset) throw new AppError('InvalidInput', undefined, [{ field: 'code', message: `Code ${body.code} is already used in this project.` }]);
    await refreshStanding(tx, asset);
    await appendAudit(tx, { actorId: actor.id, type: 'asset.created', projectId, detail: { assetId: asset.id, code: asset.code, kind: asset.kind, name: asset.name } });
    return asset;
  });
}

/** Records that a study covers an asset; both must belong to the same project. */
export async function linkStudy(s: AppServices, actor: SessionUser, assetId: string, body: z.output<typeof studyLinkSchema>) {
  return inTransaction(s.pool, async (tx) => {
    const asset = await loadAsset(tx, assetId);
    const [study] = await tx.select().from(studies).where(and(eq(studies.id, body.studyId), eq(studies.projectId, asset.projectId)));
    if (!study) throw new AppError('InvalidInput', undefined, [{ field: 'studyId', message: 'There is no study with this id in the asset\'s project.' }]);
    if (asset.kind === 'site' && body.studyCircuitId) throw new AppError('InvalidInput', undefined, [{ field: 'studyCircuitId', message: 'A circuit id applies to circuits, not sites.' }]);
    if (asset.kind === 'circuit' && body.siteEnd) throw new AppError('InvalidInput', undefined, [{ field: 'siteEnd', message: 'A route end applies to sites, not circuits.' }]);
    const [link] = await tx
      .insert(studyAssets)
      .values({ studyId: study.id, assetId, studyCircuitId: body.studyCircuitId ?? null, siteEnd: body.siteEnd ?? null })
      .onConflictDoUpdate({ target: [studyAssets.studyId, studyAssets.assetId], set: { studyCircuitId: body.studyCircuitId ?? null, siteEnd: body.siteEnd ?? null } })
      .returning();
    await appendAudit(tx, { actorId: actor.id, type: 'asset.study-linked', projectId: asset.projectId, studyId: study.id, detail: { assetId, assetCode: asset.code, studyCode: study.code } });
    return link;
  });
}

/** The assets of a project, for pickers. */
export async function listProjectAssets(db: Database, projectId: string) {
  return db.select().from(assets).where(eq(assets.projectId, projectId)).orderBy(asc(assets.code));
}

/** Everything the asset panel shows: its studies, obligations with their standing, records, and site data versions. */
export async function assetDetail(db: Database, assetId: string) {
  const asset = await loadAsset(db, assetId);
  const [links, standing, records, versions] = await Promise.all([
    db
      .select({ studyId: studies.id, code: studies.code, title: studies.title, studyCircuitId: studyAssets.studyCircuitId, siteEnd: studyAssets.siteEnd, state: studySummaries.state, revisionNumber: studySummaries.revisionNumber })
      .from(studyAssets)
      .innerJoin(studies, eq(studies.id, studyAssets.studyId))
      .leftJoin(studySummaries, eq(studySummaries.studyId, studies.id))
      .where(eq(studyAssets.assetId, assetId))
      .orderBy(asc(studies.code)),
    db
      .select({ type: obligationTypes, lastDoneOn: assetObligations.lastDoneOn, lastResult: assetObligations.lastResult, nextDueOn: assetObligations.nextDueOn })
      .from(assetObligations)
      .innerJoin(obligationTypes, eq(obligationTypes.id, assetObligations.obligationTypeId))
      .where(eq(assetObligations.assetId, assetId))
      .orderBy(asc(obligationTypes.name)),
    db
      .select({ record: obligationRecords, typeName: obligationTypes.name, recordedByName: users.name })
      .from(obligationRecords)
      .innerJoin(obligationTypes, eq(obligationTypes.id, obligationRecords.obligationTypeId))
      .innerJoin(users, eq(users.id, obligationRecords.recordedBy))
      .where(eq(obligationRecords.assetId, assetId))
      .orderBy(desc(obligationRecords.doneOn), desc(obligationRecords.createdAt)),
    asset.kind === 'site' ? db.select().from(siteSystemData).where(eq(siteSystemData.siteId, assetId)).orderBy(desc(siteSystemData.version)) : Promise.resolve([]),
  ]);
  return {
    asset,
    studies: links,
    obligations: standing,
    records: records.map((r) => ({ ...r.record, evidenceKey: undefined, hasEvidence: r.record.evidenceKey !== null, typeName: r.typeName, recordedByName: r.recordedByName })),
    systemData: versions,
  };
}
