import type { Database } from '../db/client';
import { loadRevisionScope } from '../db/revisions.repo';
import { AppError } from '../errors';
import { ENGINE_VERSION } from '../calc';
import type { CaseResult } from '../calc/bonding/results';
import { compute } from '../compute/compute-pool';
import type { StoredCaseResult } from './stored-results';

export interface RouteProfile {
  caseId: string;
  profile: CaseResult['profile'];
  /** false: read from results stored with their profiles; true: calculated again from the same inputs and engine. */
  recomputed: boolean;
}

/**
 * The route profile of one case of a calculated bonding revision, for the plot: stored with the
 * results by older revisions, recomputed (in a worker thread) for the others. A profile is only
 * drawn from the inputs and engine the stored figures came from.
 */
export async function routeProfile(db: Database, revisionId: string, caseId: string): Promise<RouteProfile> {
  const { revision, study } = await loadRevisionScope(db, revisionId);
  if (study.kind !== 'bonding') throw new AppError('NotFound', 'Only a bonding study has a route profile.');
  const stored = (revision.results as { cases?: StoredCaseResult[] } | null)?.cases?.find((c) => c.caseId === caseId);
  if (!revision.results) throw new AppError('StepRefused', 'The revision has not been calculated: calculate it first.');
  if (!stored) throw new AppError('NotFound', `There is no case "${caseId}" in this revision's results.`);
  if (stored.profile) return { caseId, profile: stored.profile, recomputed: false };
  if (revision.resultsInputsHash !== revision.inputsHash) throw new AppError('StepRefused', 'The inputs changed after the last calculation: calculate again to draw the route plot.');
  if (revision.engineVersion !== ENGINE_VERSION) throw new AppError('StepRefused', `These results come from engine ${revision.engineVersion}, and this server runs engine ${ENGINE_VERSION}: start a new revision and calculate it to draw the route plot.`);
  const profile = await compute({ task: 'profile', studyKind: study.kind, rawInputs: revision.inputs, caseId });
  if (!profile) throw new AppError('NotFound', `There is no case "${caseId}" in this revision's results.`);
  return { caseId, profile, recomputed: true };
}
