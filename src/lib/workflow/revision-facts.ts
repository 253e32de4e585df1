import { and, eq, isNull } from 'drizzle-orm';
import type { Database } from '../db/client';
import { checkValues, checklistItems, remarks, type Revision, type Study } from '../db/schema';
import { ENGINE_VERSION } from '../calc';
import { compute } from '../compute/compute-pool';
import { hasStoredProfiles } from '../studies/stored-results';
import { knownRecomputation, rememberRecomputation } from '../studies/recomputations.repo';
import { resultsHash } from './sign-off';
import type { RevisionFacts } from './revision.machine';

/**
 * Establishes the facts the machine's guards need. Call it inside the step's transaction, with
 * the revision row locked, so that no write can change a fact between this read and the step.
 * `resultsCurrent` comes from `resultsReproduce` (or is true for steps that do not recompute).
 */
export async function revisionFacts(db: Database, revision: Revision, opts: { resultsCurrent: boolean; reason?: string }): Promise<RevisionFacts> {
  // One after another: a transaction's connection runs one query at a time anyway.
  const items = await db.select().from(checklistItems).where(eq(checklistItems.revisionId, revision.id));
  const values = await db.select().from(checkValues).where(eq(checkValues.revisionId, revision.id));
  const threads = await db.select({ resolved: remarks.resolved }).from(remarks).where(and(eq(remarks.revisionId, revision.id), isNull(remarks.parentId)));
  const computed = items.filter((i) => i.kind === 'computed');
  const manual = items.filter((i) => i.kind === 'manual');
  return {
    resultsCurrent: opts.resultsCurrent,
    computedEvaluated: computed.length > 0 && computed.every((i) => i.status === 'pass' || i.status === 'fail'),
    manualAnswered: manual.every((i) => i.answer !== null),
    // The current checker's own values: an earlier checker's values stay on record but cannot
    // be edited by the one who passes, so they must not block the pass.
    checkValuesSettled: values.filter((v) => v.checkerId === revision.checkerId).every((v) => Math.abs(v.deviationPct) <= v.tolerancePct || !!v.explanation?.trim()),
    failuresJustified: items.every((i) => !(i.status === 'fail' || i.answer === 'no') || !!i.justification?.trim()),
    failuresUnexplained: computed.filter((i) => i.status === 'fail' && !i.designerJustification?.trim()).length,
    queriedItems: items.filter((i) => i.checkerVerdict === 'query').length,
    openRemarkThreads: threads.filter((t) => !t.resolved).length,
    reasonGiven: !!opts.reason?.trim(),
  };
}

/**
 * Whether the stored results are what the engine gives for the stored inputs (before submit,
 * pass and issue). When a fresh calculation of these inputs with this engine is on record
 * (`recomputations`), the stored results are compared with its hash; otherwise the core runs
 * again in a worker thread and its hash is kept for the next hand-off. Results stored with
 * route profiles (before they were left out) are always calculated again in full.
 */
export async function resultsReproduce(db: Database, revision: Revision, study: Study): Promise<boolean> {
  if (!revision.results || revision.resultsInputsHash !== revision.inputsHash || revision.engineVersion !== ENGINE_VERSION) return false;
  const stored = resultsHash(revision.results);
  const withProfiles = hasStoredProfiles(revision.results);
  if (!withProfiles) {
    const known = await knownRecomputation(db, revision.inputsHash);
    if (known) return known === stored;
  }
  const fresh = await compute({ task: 'reproduce', studyKind: study.kind, rawInputs: revision.inputs });
  await rememberRecomputation(db, revision.inputsHash, fresh.compactHash);
  return (withProfiles ? fresh.fullHash : fresh.compactHash) === stored;
}
