import { asc, eq, sql } from 'drizzle-orm';
import { LRUCache } from 'lru-cache';
import type { Database } from '../db/client';
import { revisions, signOffs, users } from '../db/schema';
import { assertId } from '../db/revisions.repo';
import { snapshotCache } from '../db/snapshot-cache';
import { inTransaction } from '../db/transaction';
import type { AppServices } from '../services';
import { AppError } from '../errors';
import { compute } from '../compute/compute-pool';
import { signOffStanding } from './sign-off';

/**
 * Results hashes by revision row version (`xmin`): PostgreSQL gives the row a new `xmin` on every
 * write to it, the results included, by whatever path, so a hash kept under one never describes
 * other figures. Hashing 50 kB-1 MB of results on every look at the sign-offs was most of the cost.
 */
const resultsHashes = new LRUCache<string, string>({ max: 10_000 });

/** The hash of a revision's stored results as they stand in the database (null before any calculation). */
async function currentResultsHash(db: Database, revisionId: string, rowVersion: string): Promise<string | null> {
  const kept = resultsHashes.get(`${revisionId}:${rowVersion}`);
  if (kept) return kept;
  const [row] = await db
    .select({ rowVersion: sql<string>`${revisions}.xmin::text`, bytes: sql<Buffer | null>`convert_to(${revisions.results}::text, 'UTF8')` })
    .from(revisions)
    .where(eq(revisions.id, revisionId));
  if (!row?.bytes) return null;
  const hash = await compute({ task: 'resultsHash', bytes: row.bytes });
  // Kept under the version of the row it was read from, which may be newer than the one asked about.
  resultsHashes.set(`${revisionId}:${row.rowVersion}`, hash);
  return hash;
}

const answers = snapshotCache<Awaited<ReturnType<typeof readSignOffs>>>(8 * 1024 * 1024);

/**
 * A revision's sign-offs, oldest first, with the signer's name and whether each still stands.
 * The results are what a signature covers: their hash is taken in a worker thread from the bytes
 * in the database, and kept for as long as the revision row is unchanged. The whole answer is
 * kept until the database next changes (see snapshotCache); a write to the results, by any path,
 * moves the snapshot, so a kept answer never vouches for other figures.
 */
export function signOffsOf(s: Pick<AppServices, 'db' | 'pool'>, revisionId: string) {
  assertId(revisionId, 'revision');
  return answers(s.db, revisionId, () => inTransaction(s.pool, (tx) => readSignOffs(tx, revisionId)));
}

/** Reads in one snapshot (repeatable read), so names, state and results come from the same moment even while someone commits. */
async function readSignOffs(tx: Database, revisionId: string) {
  await tx.execute(sql`set transaction isolation level repeatable read, read only`);
  const rows = await tx
    .select({ signOff: signOffs, name: users.name })
    .from(signOffs)
    .innerJoin(users, eq(users.id, signOffs.userId))
    .where(eq(signOffs.revisionId, revisionId))
    .orderBy(asc(signOffs.createdAt), asc(signOffs.id));
  const [revision] = await tx
    .select({ inputsHash: revisions.inputsHash, rowVersion: sql<string>`${revisions}.xmin::text`, calculated: sql<boolean>`${revisions.results} is not null` })
    .from(revisions)
    .where(eq(revisions.id, revisionId));
  if (!revision) throw new AppError('NotFound', 'There is no revision with this id.');
  // The results only when there is a signature to check them against.
  const resultsHash = rows.length && revision.calculated ? await currentResultsHash(tx, revisionId, revision.rowVersion) : null;
  const current = { inputsHash: revision.inputsHash, resultsHash };
  return rows.map(({ signOff, name }) => ({ ...signOff, name, ...signOffStanding(signOff, current) }));
}
