import { asc, eq, inArray } from 'drizzle-orm';
import type { Database } from './client';
import { memberships, projects, users } from './schema';
import type { SessionUser } from '../auth/roles';

/** Projects the user belongs to; an administrator sees every project. */
export async function listProjectsFor(db: Database, user: SessionUser) {
  const ids = Object.keys(user.projectRoles);
  const query = db.select().from(projects).orderBy(asc(projects.code));
  if (user.isAdmin) return query;
  if (ids.length === 0) return [];
  return db.select().from(projects).where(inArray(projects.id, ids)).orderBy(asc(projects.code));
}

export async function listMembers(db: Database, projectId: string) {
  return db
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.projectId, projectId))
    .orderBy(asc(users.name));
}
