import type { StudyResults } from '../calc';
import type { CaseResult } from '../calc/bonding/results';

// A long route's results are megabytes of JSON, about a third of it the route profile (the
// voltage along the route at every section end, for the plot). The stored results keep what the
// checks, screens and record tables read; the profile is recomputed from the inputs when a plot
// is drawn (src/lib/compute). Revisions stored before this keep their profiles and stay readable.

/** A bonding case as stored: everything but the route profile. */
export type StoredCaseResult = Omit<CaseResult, 'profile'> & { profile?: CaseResult['profile'] };

/** The results as stored: the route profile of each bonding case left out. */
export function compactResults<T extends StudyResults>(results: T): T {
  if (results.kind !== 'bonding') return results;
  return { ...results, cases: results.cases.map(({ profile: _profile, ...rest }) => rest) } as unknown as T;
}

/** Whether stored results still carry route profiles (revisions calculated before profiles were left out). */
export function hasStoredProfiles(results: unknown): boolean {
  const r = results as { kind?: string; cases?: Array<{ profile?: unknown }> } | null;
  return !!r && r.kind === 'bonding' && !!r.cases?.some((c) => c.profile !== undefined);
}

/** The form in which fresh results compare with stored ones: compact, unless the stored ones carry profiles. */
export function inStoredForm<T extends StudyResults>(fresh: T, stored: unknown): T {
  return hasStoredProfiles(stored) ? fresh : compactResults(fresh);
}
