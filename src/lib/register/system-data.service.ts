import { and, desc, eq, inArray, isNull } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { assets, projects, revisions, siteSystemData, studies, studyAssets, studyReviews, users, type SystemData } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import { jsonDiff } from '../json-diff';
import { MAIL_QUEUE } from '../mail/mail-delivery';
import type { SystemDataInput } from '../schemas/register.schema';
import { loadAsset, loadLiveAsset, refuseRemoved } from './assets.service';
import { needsReviewMessage } from './register-messages';
import { reviewReasons } from './revalidation';

/**
 * Publishes a new version of a site's system data and, in the same transaction, marks "needs
 * review" every issued revision it makes non-conservative: of the studies linked to the site
 * (fault levels, clearance, grid) and of those linked to a circuit whose maximum load it raises.
 * The designer and the approver of each such revision are e-mailed. Earlier versions never change.
 */
export async function publishSystemData(s: AppServices, actor: SessionUser, siteId: string, body: SystemDataInput) {
  const site = refuseRemoved(await loadAsset(s.db, siteId));
  if (site.kind !== 'site') throw new AppError('InvalidInput', 'System data belongs to a site; this asset is a circuit.');
  const circuitIds = body.maxLoads.map((l) => l.circuitAssetId);
  const circuits = circuitIds.length ? await s.db.select().from(assets).where(and(inArray(assets.id, circuitIds), eq(assets.projectId, site.projectId), eq(assets.kind, 'circuit'), isNull(assets.removedAt))) : [];
  body.maxLoads.forEach((l, i) => {
    if (!circuits.some((c) => c.id === l.circuitAssetId)) throw new AppError('InvalidInput', undefined, [{ field: `maxLoads.${i}.circuitAssetId`, message: 'There is no circuit with this id in the site\'s project.' }]);
  });
  const data: SystemData = { threePhaseFaultKa: body.threePhaseFaultKa, earthFaultKa: body.earthFaultKa, clearanceTimeS: body.clearanceTimeS, gridResistanceOhm: body.gridResistanceOhm, maxLoads: body.maxLoads };

  return inTransaction(s.pool, async (tx, sqlExecutor) => {
    // The site row lock orders two publications of the same site: version numbers never clash.
    await loadLiveAsset(tx, siteId);
    const [previous] = await tx.select().from(siteSystemData).where(eq(siteSystemData.siteId, siteId)).orderBy(desc(siteSystemData.version)).limit(1);
    const [version] = await tx
      .insert(siteSystemData)
      .values({ siteId, version: (previous?.version ?? 0) + 1, data, source: body.source, sourceDate: body.sourceDate, publishedBy: actor.id })
      .returning();

    const links = await tx
      .select({ link: studyAssets, revision: revisions, study: studies })
      .from(studyAssets)
      .innerJoin(studies, eq(studies.id, studyAssets.studyId))
      .innerJoin(revisions, and(eq(revisions.studyId, studies.id), eq(revisions.state, 'issued')))
      .where(inArray(studyAssets.assetId, [siteId, ...circuitIds]));
    const byRevision = new Map<string, typeof links>();
    for (const l of links) byRevision.set(l.revision.id, [...(byRevision.get(l.revision.id) ?? []), l]);

    const [project] = await tx.select().from(projects).where(eq(projects.id, site.projectId));
    const flagged: Array<{ studyCode: string; revisionNumber: number; reasons: string[] }> = [];
    for (const [revisionId, rows] of byRevision) {
      const { revision, study } = rows[0];
      const siteLink = rows.find((r) => r.link.assetId === siteId)?.link;
      const circuitLoads = rows
        .filter((r) => r.link.assetId !== siteId)
        .map((r) => ({ assetCode: circuits.find((c) => c.id === r.link.assetId)!.code, studyCircuitId: r.link.studyCircuitId, maxLoadA: body.maxLoads.find((m) => m.circuitAssetId === r.link.assetId)!.maxLoadA }));
      const reasons = reviewReasons(revision.inputs, data, { siteLinked: !!siteLink, siteEnd: siteLink?.siteEnd ?? null, circuitLoads });
      if (!reasons.length) continue;
      await tx.insert(studyReviews).values({ studyId: study.id, revisionId, systemDataId: version.id, reasons });
      await appendAudit(tx, { actorId: actor.id, type: 'study.needs-review', projectId: study.projectId, studyId: study.id, revisionId, detail: { site: site.code, version: version.version, reasons: reasons.map((r) => r.sentence) } });
      flagged.push({ studyCode: study.code, revisionNumber: revision.number, reasons: reasons.map((r) => r.sentence) });
      if (s.jobs) {
        const people = await tx.selectDistinct({ email: users.email }).from(users).where(inArray(users.id, [revision.designerId, revision.approverId].filter((x): x is string => !!x)));
        const c = { appUrl: s.appUrl, projectName: project.name, studyCode: study.code, studyTitle: study.title, studyId: study.id, revisionNumber: revision.number, siteCode: site.code, version: version.version, reasons: reasons.map((r) => r.sentence) };
        await s.jobs.enqueue(sqlExecutor, MAIL_QUEUE, people.map((p) => needsReviewMessage(c, p.email)));
      }
    }
    await appendAudit(tx, {
      actorId: actor.id,
      type: 'system-data.published',
      projectId: site.projectId,
      detail: { site: site.code, version: version.version, source: body.source, sourceDate: body.sourceDate, changes: jsonDiff(previous?.data ?? {}, data), studiesNeedingReview: flagged.map((f) => `${f.studyCode} rev ${f.revisionNumber}`) },
    });
    return { version, flagged };
  });
}
