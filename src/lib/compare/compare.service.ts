import { and, asc, desc, eq, inArray, lt } from 'drizzle-orm';
import type { Database } from '../db/client';
import { checklistItems, revisions } from '../db/schema';
import { loadRevisionScope } from '../db/revisions.repo';
import { AppError } from '../errors';
import type { StudyResults } from '../calc';
import { describeInputChanges } from './input-changes';
import { verdictChanges, worstChanges } from './result-changes';

const ISSUED = ['issued', 'superseded'] as const;

export type CompareAgainst = 'previous' | 'last-issued' | { revisionId: string };

/** What changed from one revision of a study to another: inputs in words, worst values, verdicts. */
export async function compareRevisions(db: Database, revisionId: string, against: CompareAgainst) {
  const { revision, study } = await loadRevisionScope(db, revisionId);
  const base = await baseRevision(db, revision, against);
  if (base && base.studyId !== study.id) throw new AppError('InvalidInput', 'Only revisions of the same study can be compared.', [{ field: 'against', message: 'Choose a revision of the same study.' }]);
  const side = (r: typeof revision) => ({ id: r.id, number: r.number, state: r.state, issuedAt: r.issuedAt, calculated: r.results !== null });
  if (!base || base.id === revision.id) return { study: { id: study.id, code: study.code }, from: null, to: side(revision), inputChanges: [], worstChanges: [], verdictChanges: [], resultsCompared: false };
  const [itemsBefore, itemsAfter] = await Promise.all([
    db.select().from(checklistItems).where(eq(checklistItems.revisionId, base.id)).orderBy(asc(checklistItems.sortOrder)),
    db.select().from(checklistItems).where(eq(checklistItems.revisionId, revision.id)).orderBy(asc(checklistItems.sortOrder)),
  ]);
  const resultsCompared = base.results !== null && revision.results !== null;
  return {
    study: { id: study.id, code: study.code },
    from: side(base),
    to: side(revision),
    inputChanges: describeInputChanges(base.inputs, revision.inputs),
    worstChanges: resultsCompared ? worstChanges(base.results as StudyResults, revision.results as StudyResults) : [],
    verdictChanges: resultsCompared ? verdictChanges(itemsBefore, itemsAfter) : [],
    resultsCompared,
  };
}

export type RevisionComparison = Awaited<ReturnType<typeof compareRevisions>>;

async function baseRevision(db: Database, revision: { id: string; studyId: string; number: number }, against: CompareAgainst) {
  if (typeof against === 'object') {
    const { revision: other } = await loadRevisionScope(db, against.revisionId);
    return other;
  }
  const [row] = await db
    .select()
    .from(revisions)
    .where(and(eq(revisions.studyId, revision.studyId), lt(revisions.number, revision.number), against === 'last-issued' ? inArray(revisions.state, [...ISSUED]) : undefined))
    .orderBy(desc(revisions.number))
    .limit(1);
  return row ?? null;
}
