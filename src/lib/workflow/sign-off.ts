import { canonicalJson, sha256Hex } from '../canonical-json';

// A sign-off covers the inputs and the results as they were when it was signed: the row keeps
// both hashes. When either differs from the revision's current ones, the signature no longer
// covers what the revision says, and every screen and record shows it as void.

/** SHA-256 of the canonical JSON (keys sorted) of a revision's results, or null before any calculation. */
export function resultsHash(results: unknown): string | null {
  return results === null || results === undefined ? null : sha256Hex(canonicalJson(results));
}

export interface SignOffStanding {
  /** True while the signature covers the revision's current inputs and results. */
  valid: boolean;
  /** Why it is void, in words; null when valid. */
  voidReason: string | null;
}

/**
 * Whether a sign-off still covers the revision, given the hashes of its current inputs and
 * results (`resultsHash`, worked out once for all of a revision's sign-offs). For the record as
 * well as the screens.
 */
export function signOffStanding(
  signOff: { inputsHash: string | null; resultsHash: string | null },
  current: { inputsHash: string; resultsHash: string | null },
): SignOffStanding {
  if (!signOff.inputsHash || !signOff.resultsHash) return { valid: false, voidReason: 'Signed before sign-offs recorded what they covered: it cannot be verified.' };
  const inputsChanged = signOff.inputsHash !== current.inputsHash;
  const resultsChanged = signOff.resultsHash !== current.resultsHash;
  if (inputsChanged && resultsChanged) return { valid: false, voidReason: 'Void: the inputs and the results changed after this signature.' };
  if (inputsChanged) return { valid: false, voidReason: 'Void: the inputs changed after this signature.' };
  if (resultsChanged) return { valid: false, voidReason: 'Void: the results changed after this signature.' };
  return { valid: true, voidReason: null };
}
