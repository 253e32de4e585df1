import { eq } from 'drizzle-orm';
import type { Database } from '../db/client';
import { checkValues, checklistItems, type Revision, type Study } from '../db/schema';
import { canonicalJson } from '../canonical-json';
import { ENGINE_VERSION, calculateStudy } from '../calc';
import { parseStudyInputs } from '../studies/study-input';
import type { RevisionFacts } from './revision.machine';

/**
 * Establishes the facts the machine's guards need. Call it inside the step's transaction, with
 * the revision row locked, so that no write can change a fact between this read and the step.
 * `resultsCurrent` comes from `resultsReproduce` (or is true for steps that do not recompute).
 */
export async function revisionFacts(db: Database, revision: Revision, opts: { resultsCurrent: boolean; reason?: string }): Promise<RevisionFacts> {
  const [items, values] = await Promise.all([
    db.select().from(checklistItems).where(eq(checklistItems.revisionId, revision.id)),
    db.select().from(checkValues).where(eq(checkValues.revisionId, revision.id)),
  ]);
  const computed = items.filter((i) => i.kind === 'computed');
  const manual = items.filter((i) => i.kind === 'manual');
  return {
    resultsCurrent: opts.resultsCurrent,
    computedEvaluated: computed.length > 0 && computed.every((i) => i.status === 'pass' || i.status === 'fail'),
    manualAnswered: manual.every((i) => i.answer !== null),
    checkValuesSettled: values.every((v) => Math.abs(v.deviationPct) <= v.tolerancePct || !!v.explanation?.trim()),
    failuresJustified: items.every((i) => !(i.status === 'fail' || i.answer === 'no') || !!i.justification?.trim()),
    reasonGiven: !!opts.reason?.trim(),
  };
}

/** Runs the core again on the stored inputs and demands the same figures (before submit, pass and issue). */
export function resultsReproduce(revision: Revision, study: Study): boolean {
  if (!revision.results || revision.resultsInputsHash !== revision.inputsHash || revision.engineVersion !== ENGINE_VERSION) return false;
  const fresh = calculateStudy(parseStudyInputs(revision.inputs, study.kind));
  return canonicalJson(fresh) === canonicalJson(revision.results);
}
