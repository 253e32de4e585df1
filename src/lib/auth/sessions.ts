import { and, eq, gt, isNull, lt, sql } from 'drizzle-orm';
import type { Database } from '../db/client';
import { userSessions } from '../db/schema';
import { loadSessionUser } from '../db/users.repo';
import type { SessionUser } from './roles';

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

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function sessionIsLive(db: Database, sessionId: string, userId: string): Promise<boolean> {
  if (!UUID.test(sessionId) || !UUID.test(userId)) return false;
  const rows = await db
    .select({ id: userSessions.id })
    .from(userSessions)
    .where(and(eq(userSessions.id, sessionId), eq(userSessions.userId, userId), isNull(userSessions.revokedAt), gt(userSessions.expiresAt, sql`now()`)));
  return rows.length === 1;
}

/**
 * The signed-in person for a decoded Auth.js session, or null when there is none, when it names
 * no server-side session (a token from before sessions were recorded), or when that session was
 * ended or has expired. Database errors propagate, so an outage is not mistaken for signing out.
 */
export async function signedInUser(db: Database, session: { user?: unknown } | null): Promise<SessionUser | null> {
  const claims = (session?.user ?? {}) as { id?: unknown; sid?: unknown };
  if (typeof claims.id !== 'string' || typeof claims.sid !== 'string') return null;
  if (!(await sessionIsLive(db, claims.sid, claims.id))) return null;
  return loadSessionUser(db, claims.id);
}
