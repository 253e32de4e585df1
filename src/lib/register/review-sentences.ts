import { and, eq, inArray } from 'drizzle-orm';
import type { Database } from '../db/client';
import { revisions, studies, studyReviews } from '../db/schema';

/** "B01 rev 2: <first reason>" for every open review in the projects (for the digest). */
export async function openReviewSentences(db: Database, projectIds: string[]): Promise<string[]> {
  if (!projectIds.length) return [];
  const rows = await db
    .select({ code: studies.code, number: revisions.number, reasons: studyReviews.reasons })
    .from(studyReviews)
    .innerJoin(revisions, and(eq(revisions.id, studyReviews.revisionId), eq(revisions.state, 'issued')))
    .innerJoin(studies, eq(studies.id, studyReviews.studyId))
    .where(inArray(studies.projectId, projectIds))
    .orderBy(studies.code);
  return rows.map((r) => `${r.code} rev ${r.number}: ${r.reasons.map((x) => x.sentence).join(' ')}`);
}
