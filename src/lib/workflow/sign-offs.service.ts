import { asc, eq } from 'drizzle-orm';
import type { Database } from '../db/client';
import { signOffs, users } from '../db/schema';
import { loadRevisionScope } from '../db/revisions.repo';
import { signOffStanding } from './sign-off';

/** A revision's sign-offs, oldest first, with the signer's name and whether each still stands. */
export async function signOffsOf(db: Database, revisionId: string) {
  const { revision } = await loadRevisionScope(db, revisionId);
  const rows = await db
    .select({ signOff: signOffs, name: users.name })
    .from(signOffs)
    .innerJoin(users, eq(users.id, signOffs.userId))
    .where(eq(signOffs.revisionId, revisionId))
    .orderBy(asc(signOffs.createdAt));
  return rows.map(({ signOff, name }) => ({ ...signOff, name, ...signOffStanding(signOff, revision) }));
}
