import { and, asc, desc, eq } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/client';
import { AppError } from '../errors';
import { assets, revisions, siteSystemData, studyReviews, type ReviewReason } from '../db/schema';
import { assertId, loadRevisionScope, loadStudyScope } from '../db/revisions.repo';
import { startNewRevision, updateInputs } from '../studies/studies.service';
import type { applyProposalsSchema } from '../schemas/register.schema';
import { applyReasons, valueAt } from './revalidation';
import { editableStates } from '../workflow/revision.machine';

/**
 * The open reviews of a study: those whose flagged revision is still the issued one (issuing a
 * later revision supersedes it and so closes them), newest first, with the site data behind each.
 */
export async function openReviews(db: Database, studyId: string) {
  return db
    .select({ id: studyReviews.id, revisionId: studyReviews.revisionId, revisionNumber: revisions.number, reasons: studyReviews.reasons, createdAt: studyReviews.createdAt, siteCode: assets.code, version: siteSystemData.version, source: siteSystemData.source, sourceDate: siteSystemData.sourceDate })
    .from(studyReviews)
    .innerJoin(revisions, and(eq(revisions.id, studyReviews.revisionId), eq(revisions.state, 'issued')))
    .innerJoin(siteSystemData, eq(siteSystemData.id, studyReviews.systemDataId))
    .innerJoin(assets, eq(assets.id, siteSystemData.siteId))
    .where(eq(studyReviews.studyId, studyId))
    .orderBy(desc(studyReviews.createdAt), asc(studyReviews.id));
}

/** The new values the open reviews propose, one per inputs field (the newest review wins a field two propose). */
export function proposalsOf(reviews: Array<{ reasons: ReviewReason[] }>): ReviewReason[] {
  const byPath = new Map<string, ReviewReason>();
  for (const r of reviews) for (const reason of r.reasons) if (!byPath.has(reason.path)) byPath.set(reason.path, reason);
  return [...byPath.values()];
}

/**
 * What the study screen shows: the open reviews, the values a new revision would take, and the
 * revision being edited after the issued one, if any (so the designer picks up where they left).
 */
export async function studyReviewState(db: Database, studyId: string) {
  await loadStudyScope(db, studyId);
  const reviews = await openReviews(db, studyId);
  const [latest] = await db.select({ id: revisions.id, number: revisions.number, version: revisions.version, state: revisions.state }).from(revisions).where(eq(revisions.studyId, studyId)).orderBy(desc(revisions.number)).limit(1);
  const editing = reviews.length && latest && editableStates.has(latest.state) && latest.number > reviews[0].revisionNumber ? latest : null;
  return { reviews, proposals: proposalsOf(reviews), editing };
}

/** Starts the next revision of a study under review; its new values are then confirmed one by one. */
export async function startReviewRevision(s: AppServices, actor: SessionUser, studyId: string) {
  const reviews = await openReviews(s.db, studyId);
  if (!reviews.length) throw new AppError('StepRefused', 'This study has no open review: start a revision from the study in the usual way.');
  const revision = await startNewRevision(s, actor, studyId);
  return { revision, proposals: proposalsOf(reviews) };
}

/**
 * Writes the confirmed new values into a draft revision of the study under review, through the
 * ordinary inputs change (version check, audit with the changes in words). Fields the designer
 * did not confirm stay as they were.
 */
export async function applyProposals(s: AppServices, actor: SessionUser, studyId: string, body: z.output<typeof applyProposalsSchema>) {
  assertId(body.revisionId, 'revision');
  const { revision, study } = await loadRevisionScope(s.db, body.revisionId);
  if (study.id !== studyId) throw new AppError('InvalidInput', undefined, [{ field: 'revisionId', message: 'This revision belongs to another study.' }]);
  const proposals = proposalsOf(await openReviews(s.db, studyId));
  const chosen = body.accept.map((path, i) => {
    const found = proposals.find((p) => p.path === path);
    if (!found) throw new AppError('InvalidInput', undefined, [{ field: `accept.${i}`, message: `No open review proposes a new value for ${path}.` }]);
    // The draft may have been edited since: a field that no longer holds the reviewed value is left to the designer.
    const current = valueAt(revision.inputs, path);
    if (current !== found.before && current !== found.after) throw new AppError('InvalidInput', undefined, [{ field: `accept.${i}`, message: `${path} is now ${String(current)}, not the reviewed ${found.before}: change it by hand.` }]);
    return found;
  });
  let inputs: unknown;
  try {
    inputs = applyReasons(revision.inputs, chosen);
  } catch {
    throw new AppError('InvalidInput', 'The revision\'s inputs no longer have the fields the review names: change them by hand.');
  }
  return updateInputs(s, actor, body.revisionId, inputs, body.version);
}
