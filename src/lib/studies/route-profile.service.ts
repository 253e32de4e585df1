import { eq, sql } from 'drizzle-orm';
import { LRUCache } from 'lru-cache';
import type { Database } from '../db/client';
import { perHandle } from '../db/per-handle';
import { revisions, studies } from '../db/schema';
import { assertId } from '../db/revisions.repo';
import { AppError } from '../errors';
import { ENGINE_VERSION } from '../calc';
import { compute } from '../compute/compute-pool';

/**
 * Recomputed profiles as JSON text, keyed by what determines them (inputs hash, engine version,
 * case): an entry can never be out of date, so every server process may keep its own. Bounded
 * by size, as a long route's profiles run to megabytes.
 */
const recomputedProfiles = new LRUCache<string, string>({ maxSize: 64 * 1024 * 1024, sizeCalculation: (text) => Math.max(1, text.length) });

/**
 * The stored case's own profile (older revisions kept them) as JSON text, found in one pass over
 * the stored cases: null when there is no such case, '' when the case holds no profile.
 */
const storedProfile = sql<string | null>`(select coalesce((c->'profile')::text, '') from jsonb_array_elements(${revisions.results}->'cases') c where c->>'caseId' = ${sql.placeholder('caseId')} limit 1)`;

/** What decides a route profile request, in one read; prepared once per database handle, as the plot asks for it often. */
function scopeQuery(db: Database) {
  return db
    .select({
      projectId: studies.projectId,
      kind: studies.kind,
      inputs: revisions.inputs,
      inputsHash: revisions.inputsHash,
      resultsInputsHash: revisions.resultsInputsHash,
      engineVersion: revisions.engineVersion,
      calculated: sql<boolean>`${revisions.results} is not null`,
      storedProfile,
    })
    .from(revisions)
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .where(eq(revisions.id, sql.placeholder('id')))
    .prepare('route_profile_scope');
}
const scopeQueries = perHandle(scopeQuery);

async function profileScope(db: Database, revisionId: string, caseId: string) {
  assertId(revisionId, 'revision');
  const [row] = await scopeQueries(db).execute({ id: revisionId, caseId });
  if (!row) throw new AppError('NotFound', 'There is no revision with this id.');
  return { ...row, caseFound: row.storedProfile !== null, storedProfileJson: row.storedProfile || null };
}

/**
 * The route profile of one case of a calculated bonding revision, for the plot, as the JSON text
 * of `{ caseId, profile, recomputed }`: stored with the results by older revisions (recomputed
 * false), recomputed in a worker thread for the others. A profile is only drawn from the inputs
 * and engine the stored figures came from. `authorizeProject` runs before anything is computed.
 */
export async function routeProfileJson(db: Database, revisionId: string, caseId: string, authorizeProject: (projectId: string) => void): Promise<string> {
  const scope = await profileScope(db, revisionId, caseId);
  authorizeProject(scope.projectId);
  if (scope.kind !== 'bonding') throw new AppError('NotFound', 'Only a bonding study has a route profile.');
  if (!scope.calculated) throw new AppError('StepRefused', 'The revision has not been calculated: calculate it first.');
  if (!scope.caseFound) throw new AppError('NotFound', `There is no case "${caseId}" in this revision's results.`);
  const answer = (profileJson: string, recomputed: boolean) => `{"caseId":${JSON.stringify(caseId)},"profile":${profileJson},"recomputed":${recomputed}}`;
  if (scope.storedProfileJson !== null) return answer(scope.storedProfileJson, false);
  if (scope.resultsInputsHash !== scope.inputsHash) throw new AppError('StepRefused', 'The inputs changed after the last calculation: calculate again to draw the route plot.');
  if (scope.engineVersion !== ENGINE_VERSION) throw new AppError('StepRefused', `These results come from engine ${scope.engineVersion}, and this server runs engine ${ENGINE_VERSION}: start a new revision and calculate it to draw the route plot.`);
  const key = `${scope.inputsHash}|${ENGINE_VERSION}|${caseId}`;
  let profileJson = recomputedProfiles.get(key);
  if (profileJson === undefined) {
    const profile = await compute({ task: 'profile', studyKind: scope.kind, rawInputs: scope.inputs, caseId });
    if (!profile) throw new AppError('NotFound', `There is no case "${caseId}" in this revision's results.`);
    profileJson = JSON.stringify(profile);
    recomputedProfiles.set(key, profileJson);
  }
  return answer(profileJson, true);
}
