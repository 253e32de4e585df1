import { LRUCache } from 'lru-cache';

/**
 * A revision's stored results as JSON bytes, by revision id and version, for the revision screen.
 * Results change only in a calculation, which raises the version in the same statement (see
 * calculateRevision), so an entry for (id, version) never goes out of date, and each server
 * process may keep its own: the version is read from the database on every request. Reading and
 * printing the jsonb is most of what the database spends on a revision screen. Checks of the
 * results themselves (hand-offs, sign-offs, calculate) always read the database.
 */
const cache = new LRUCache<string, Buffer>({ maxSize: 64 * 1024 * 1024, sizeCalculation: (bytes) => Math.max(1, bytes.length) });

const key = (revisionId: string, version: number) => `${revisionId}:${version}`;

export const cachedResultsBytes = (revisionId: string, version: number) => cache.get(key(revisionId, version));

export function rememberResultsBytes(revisionId: string, version: number, bytes: Buffer): void {
  cache.set(key(revisionId, version), bytes);
}
