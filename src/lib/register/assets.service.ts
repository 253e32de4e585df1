import { and, asc, desc, eq, inArray, isNull, ne, notInArray, sql } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/client';
import { AppError } from '../errors';
import { type Asset, assetObligations, assets, obligationRecords, obligationTypes, revisions, siteSystemData, studies, studyAssets, studySummaries, users } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import { assertId } from '../db/revisions.repo';
import { jsonDiff } from '../json-diff';
import type { assetEditSchema, newAssetSchema, studyLinkEditSchema, studyLinkSchema } from '../schemas/register.schema';
import { owedTypesOf, refreshStanding } from './obligation-standing';

/** An asset, or NotFound. */
export async function loadAsset(db: Database, assetId: string) {
  assertId(assetId, 'asset');
  const [asset] = await db.select().from(assets).where(eq(assets.id, assetId));
  if (!asset) throw new AppError('NotFound', 'There is no asset with this id.');
  return asset;
}

/**
 * An asset still in the register, locked for the rest of the transaction (writes to one asset
 * take turns); a removed asset can no longer change.
 */
export async function loadLiveAsset(tx: Database, assetId: string) {
  assertId(assetId, 'asset');
  const [asset] = await tx.select().from(assets).where(eq(assets.id, assetId)).for('no key update');
  if (!asset) throw new AppError('NotFound', 'There is no asset with this id.');
  return refuseRemoved(asset);
}

/** The asset, unless it was taken off the register. */
export function refuseRemoved<A extends { code: string; removedAt: Date | null }>(asset: A): A {
  if (asset.removedAt) throw new AppError('NotFound', `Asset ${asset.code} was removed from the register; it can no longer change.`);
  return asset;
}

export const projectOfAsset = async (db: Database, assetId: string) => (await loadAsset(db, assetId)).projectId;

/**
 * The asset in the register that already holds `code` in the project, compared without regard to
 * case as the unique index does (`assetId` itself excepted, so an asset may change its own case).
 */
async function holderOfCode(tx: Database, projectId: string, code: string, assetId?: string) {
  const [holder] = await tx
    .select({ code: assets.code, name: assets.name })
    .from(assets)
    .where(and(eq(assets.projectId, projectId), sql`lower(${assets.code}) = lower(${code})`, isNull(assets.removedAt), assetId ? ne(assets.id, assetId) : undefined));
  return holder;
}

/** The field error for a code another asset in the register holds, naming that asset. */
const codeTaken = (code: string, holder: { code: string; name: string }) =>
  new AppError('InvalidInput', undefined, [
    { field: 'code', message: holder.code === code ? `Code ${code} is already used in this project by ${holder.name}.` : `Code ${code} is already used in this project as ${holder.code} (${holder.name}): codes are the same whatever their case.` },
  ]);

/** Adds a circuit or site to a project, owing every obligation its owner standard sets. */
export async function createAsset(s: AppServices, actor: SessionUser, projectId: string, body: z.output<typeof newAssetSchema>) {
  return inTransaction(s.pool, async (tx) => {
    const [asset] = await tx
      .insert(assets)
      .values({ projectId, kind: body.kind, siteKind: body.kind === 'site' ? body.siteKind : null, code: body.code, name: body.name, route: body.route, ownerStandard: body.ownerStandard, inServiceOn: body.inServiceOn, createdBy: actor.id })
      .onConflictDoNothing()
      .returning();
    if (!asset) {
      // The only unique key an insert can meet is the code's; its holder may have been removed since.
      const holder = await holderOfCode(tx, projectId, body.code);
      throw holder ? codeTaken(body.code, holder) : new AppError('Conflict', `Code ${body.code} was in use a moment ago: try again.`, [{ field: 'code', message: `Code ${body.code} was in use a moment ago: try again.` }]);
    }
    await refreshStanding(tx, asset);
    await appendAudit(tx, { actorId: actor.id, type: 'asset.created', projectId, detail: { assetId: asset.id, code: asset.code, kind: asset.kind, name: asset.name } });
    return asset;
  });
}

/** A circuit id given for a bonding study must name one of the circuits of its latest revision. */
async function assertStudyCircuit(tx: Database, studyId: string, circuitId: string | null | undefined) {
  if (!circuitId) return;
  const [latest] = await tx
    .select({ kind: studies.kind, inputs: revisions.inputs })
    .from(revisions)
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .where(eq(revisions.studyId, studyId))
    .orderBy(desc(revisions.number))
    .limit(1);
  if (latest?.kind !== 'bonding') return;
  const ids = ((latest.inputs as { circuits?: Array<{ id: string }> }).circuits ?? []).map((c) => c.id);
  if (!ids.includes(circuitId)) throw new AppError('InvalidInput', undefined, [{ field: 'studyCircuitId', message: `The study has no circuit ${circuitId}: its circuits are ${ids.join(', ') || 'none yet'}.` }]);
}

/** Records that a study covers an asset; both must belong to the same project. */
export async function linkStudy(s: AppServices, actor: SessionUser, assetId: string, body: z.output<typeof studyLinkSchema>) {
  return inTransaction(s.pool, async (tx) => {
    const asset = await loadLiveAsset(tx, assetId);
    const [study] = await tx.select().from(studies).where(and(eq(studies.id, body.studyId), eq(studies.projectId, asset.projectId)));
    if (!study) throw new AppError('InvalidInput', undefined, [{ field: 'studyId', message: 'There is no study with this id in the asset\'s project.' }]);
    if (asset.kind === 'site' && body.studyCircuitId) throw new AppError('InvalidInput', undefined, [{ field: 'studyCircuitId', message: 'A circuit id applies to circuits, not sites.' }]);
    if (asset.kind === 'circuit' && body.siteEnd) throw new AppError('InvalidInput', undefined, [{ field: 'siteEnd', message: 'A route end applies to sites, not circuits.' }]);
    await assertStudyCircuit(tx, study.id, body.studyCircuitId);
    const [link] = await tx
      .insert(studyAssets)
      .values({ studyId: study.id, assetId, studyCircuitId: body.studyCircuitId ?? null, siteEnd: body.siteEnd ?? null })
      .onConflictDoUpdate({ target: [studyAssets.studyId, studyAssets.assetId], set: { studyCircuitId: body.studyCircuitId ?? null, siteEnd: body.siteEnd ?? null } })
      .returning();
    await appendAudit(tx, { actorId: actor.id, type: 'asset.study-linked', projectId: asset.projectId, studyId: study.id, detail: { assetId, assetCode: asset.code, studyCode: study.code } });
    return link;
  });
}

/** The assets of a project still in the register, for pickers. */
export async function listProjectAssets(db: Database, projectId: string) {
  return db.select().from(assets).where(and(eq(assets.projectId, projectId), isNull(assets.removedAt))).orderBy(asc(assets.code));
}

const EDITABLE = ['code', 'name', 'route', 'siteKind', 'ownerStandard', 'inServiceOn'] as const;

/**
 * Changes an asset's details. A new service date or owner standard moves what it owes and when:
 * the obligations of a standard it no longer follows are dropped (their records stay), and its
 * standing is worked out again. Audited with the changes; nothing is written when nothing changes.
 */
export async function editAsset(s: AppServices, actor: SessionUser, assetId: string, body: z.output<typeof assetEditSchema>) {
  return inTransaction(s.pool, async (tx) => {
    const before = await loadLiveAsset(tx, assetId);
    if (body.siteKind !== undefined && before.kind !== 'site') throw new AppError('InvalidInput', undefined, [{ field: 'siteKind', message: 'A site kind applies to sites, not circuits.' }]);
    const changes: Partial<Pick<Asset, (typeof EDITABLE)[number]>> = {};
    for (const key of EDITABLE) if (body[key] !== undefined && body[key] !== before[key]) Object.assign(changes, { [key]: body[key] });
    if (!Object.keys(changes).length) return before;
    if (changes.code) {
      const holder = await holderOfCode(tx, before.projectId, changes.code, assetId);
      if (holder) throw codeTaken(changes.code, holder);
    }
    const [after] = await tx.update(assets).set(changes).where(eq(assets.id, assetId)).returning();
    if (changes.ownerStandard !== undefined) {
      const owed = (await owedTypesOf(tx, after)).map((t) => t.id);
      await tx.delete(assetObligations).where(and(eq(assetObligations.assetId, assetId), owed.length ? notInArray(assetObligations.obligationTypeId, owed) : undefined));
    }
    if (changes.ownerStandard !== undefined || changes.inServiceOn !== undefined) await refreshStanding(tx, after);
    const fields = (a: typeof before) => Object.fromEntries(Object.keys(changes).map((k) => [k, a[k as keyof typeof changes]]));
    await appendAudit(tx, { actorId: actor.id, type: 'asset.edited', projectId: before.projectId, detail: { assetId, assetCode: after.code, changes: jsonDiff(fields(before), fields(after)) } });
    return after;
  });
}

/**
 * Takes an asset off the register: its study links and what it owes go (no more reminders), it
 * leaves the register and its pickers, and its code is free again. Its records, evidence, system
 * data versions and audit trail stay.
 */
export async function removeAsset(s: AppServices, actor: SessionUser, assetId: string) {
  return inTransaction(s.pool, async (tx) => {
    const asset = await loadLiveAsset(tx, assetId);
    const unlinked = await tx.delete(studyAssets).where(eq(studyAssets.assetId, assetId)).returning({ studyId: studyAssets.studyId });
    const codes = unlinked.length ? (await tx.select({ code: studies.code }).from(studies).where(inArray(studies.id, unlinked.map((l) => l.studyId)))).map((r) => r.code).sort() : [];
    await tx.delete(assetObligations).where(eq(assetObligations.assetId, assetId));
    const [removed] = await tx.update(assets).set({ removedAt: new Date(), removedBy: actor.id }).where(eq(assets.id, assetId)).returning();
    await appendAudit(tx, { actorId: actor.id, type: 'asset.removed', projectId: asset.projectId, detail: { assetId, assetCode: asset.code, name: asset.name, unlinkedStudies: codes } });
    return removed;
  });
}

/** A study's link to the asset, or NotFound. */
async function loadLink(tx: Database, assetId: string, studyId: string) {
  assertId(studyId, 'study');
  const [row] = await tx.select({ link: studyAssets, studyCode: studies.code }).from(studyAssets).innerJoin(studies, eq(studies.id, studyAssets.studyId)).where(and(eq(studyAssets.assetId, assetId), eq(studyAssets.studyId, studyId)));
  if (!row) throw new AppError('NotFound', 'This study is not linked to the asset.');
  return row;
}

/** Changes the circuit in the study a circuit is, or the route end a site stands at. */
export async function editStudyLink(s: AppServices, actor: SessionUser, assetId: string, studyId: string, body: z.output<typeof studyLinkEditSchema>) {
  return inTransaction(s.pool, async (tx) => {
    const asset = await loadLiveAsset(tx, assetId);
    if (asset.kind === 'site' && body.studyCircuitId) throw new AppError('InvalidInput', undefined, [{ field: 'studyCircuitId', message: 'A circuit id applies to circuits, not sites.' }]);
    if (asset.kind === 'circuit' && body.siteEnd) throw new AppError('InvalidInput', undefined, [{ field: 'siteEnd', message: 'A route end applies to sites, not circuits.' }]);
    const { link: before, studyCode } = await loadLink(tx, assetId, studyId);
    await assertStudyCircuit(tx, studyId, body.studyCircuitId);
    const set = { ...(body.studyCircuitId !== undefined ? { studyCircuitId: body.studyCircuitId } : {}), ...(body.siteEnd !== undefined ? { siteEnd: body.siteEnd } : {}) };
    const [after] = await tx.update(studyAssets).set(set).where(and(eq(studyAssets.assetId, assetId), eq(studyAssets.studyId, studyId))).returning();
    await appendAudit(tx, {
      actorId: actor.id,
      type: 'asset.study-link-changed',
      projectId: asset.projectId,
      studyId,
      detail: { assetId, assetCode: asset.code, studyCode, changes: jsonDiff({ studyCircuitId: before.studyCircuitId, siteEnd: before.siteEnd }, { studyCircuitId: after.studyCircuitId, siteEnd: after.siteEnd }) },
    });
    return after;
  });
}

/** Records that a study no longer covers the asset. */
export async function unlinkStudy(s: AppServices, actor: SessionUser, assetId: string, studyId: string) {
  return inTransaction(s.pool, async (tx) => {
    const asset = await loadLiveAsset(tx, assetId);
    const { studyCode } = await loadLink(tx, assetId, studyId);
    await tx.delete(studyAssets).where(and(eq(studyAssets.assetId, assetId), eq(studyAssets.studyId, studyId)));
    await appendAudit(tx, { actorId: actor.id, type: 'asset.study-unlinked', projectId: asset.projectId, studyId, detail: { assetId, assetCode: asset.code, studyCode } });
    return { assetId, studyId };
  });
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
