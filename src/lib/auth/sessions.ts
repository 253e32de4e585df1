import { and, eq, gt, isNull, lt, sql } from 'drizzle-orm';
import type { Database } from '../db/client';
import { perHandle } from '../db/per-handle';
import { memberships, userSessions, users } from '../db/schema';
import type { ProjectRole } from '../db/schema/projects';
import type { SessionUser } from './roles';
import type { SessionClaims } from './session-token';

/** Records a new sign-in; the returned id goes into the JWT as `sid`. */
export async function openSession(db: Database, userId: string, maxAgeSeconds: number): Promise<string> {
  // Housekeeping on the way: rows a day past their end can never be accepted again.
  await db.delete(userSessions).where(lt(userSessions.expiresAt, sql`now() - interval '1 day'`));
  const [row] = await db
    .insert(userSessions)
    .values({ userId, expiresAt: sql`now() + make_interval(secs => ${maxAgeSeconds})` })
    .returning({ id: userSessions.id });
  return row.id;
}

/** Ends a session on the server: its cookie is refused from now on, wherever it was copied. */
export async function revokeSession(db: Database, sessionId: string): Promise<void> {
  await db.update(userSessions).set({ revokedAt: sql`now()` }).where(and(eq(userSessions.id, sessionId), isNull(userSessions.revokedAt)));
}

/** The open session's person and their roles per project, prepared once per database handle (it runs on every request). */
function sessionQuery(db: Database) {
  return db
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      isAdmin: users.isAdmin,
      roles: sql<Array<[string, ProjectRole]>>`coalesce((select json_agg(json_build_array(${memberships.projectId}, ${memberships.role})) from ${memberships} where ${memberships.userId} = ${users.id}), '[]'::json)`,
    })
    .from(userSessions)
    .innerJoin(users, eq(users.id, userSessions.userId))
    .where(and(eq(userSessions.id, sql.placeholder('sid')), eq(userSessions.userId, sql.placeholder('uid')), isNull(userSessions.revokedAt), gt(userSessions.expiresAt, sql`now()`)))
    .prepare('signed_in_user');
}
const sessionQueries = perHandle(sessionQuery);

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * The signed-in person for a session's claims, or null when there are none, or when the session
 * they name was ended or has expired, or the person no longer exists. One query on every request:
 * the open session, the person and their roles per project. Database errors propagate, so an
 * outage is not mistaken for signing out.
 */
export async function signedInUser(db: Database, claims: SessionClaims | null): Promise<SessionUser | null> {
  if (!claims || !UUID.test(claims.sid) || !UUID.test(claims.uid)) return null;
  const rows = await sessionQueries(db).execute({ sid: claims.sid, uid: claims.uid });
  const [row] = rows;
  if (!row) return null;
  const projectRoles: Record<string, ProjectRole[]> = {};
  for (const [projectId, role] of row.roles) (projectRoles[projectId] ??= []).push(role);
  return { id: row.id, email: row.email, name: row.name, isAdmin: row.isAdmin, projectRoles };
}
