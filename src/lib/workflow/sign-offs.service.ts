import { asc, eq, sql } from 'drizzle-orm';
import type { Database } from '../db/client';
import { revisions, signOffs, users } from '../db/schema';
import { assertId } from '../db/revisions.repo';
import { AppError } from '../errors';
import { compute } from '../compute/compute-pool';
import { signOffStanding } from './sign-off';

/**
 * A revision's sign-offs, oldest first, with the signer's name and whether each still stands.
 * The results are read from the database (they are what a signature covers) as bytes and hashed
 * once, in a worker thread.
 */
export async function signOffsOf(db: Database, revisionId: string) {
  assertId(revisionId, 'revision');
  const rows = await db
    .select({ signOff: signOffs, name: users.name })
    .from(signOffs)
    .innerJoin(users, eq(users.id, signOffs.userId))
    .where(eq(signOffs.revisionId, revisionId))
    .orderBy(asc(signOffs.createdAt), asc(signOffs.id));
  // The results only when there is a signature to check them against.
  const [revision] = await db
    .select({ inputsHash: revisions.inputsHash, resultsBytes: rows.length ? sql<Buffer | null>`convert_to(${revisions.results}::text, 'UTF8')` : sql<null>`null` })
    .from(revisions)
    .where(eq(revisions.id, revisionId));
  if (!revision) throw new AppError('NotFound', 'There is no revision with this id.');
  const current = { inputsHash: revision.inputsHash, resultsHash: revision.resultsBytes ? await compute({ task: 'resultsHash', bytes: revision.resultsBytes }) : null };
  return rows.map(({ signOff, name }) => ({ ...signOff, name, ...signOffStanding(signOff, current) }));
}
