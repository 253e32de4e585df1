import { eq } from 'drizzle-orm';
import type { Database } from './client';
import { memberships, projects, users, type User } from './schema';
import type { SessionUser } from '../auth/roles';
import type { ProjectRole } from './schema/projects';

export async function findUserByEmail(db: Database, email: string): Promise<User | undefined> {
  const [row] = await db.select().from(users).where(eq(users.email, email.trim().toLowerCase()));
  return row;
}

/** The user with their roles per project, or null when the id no longer exists. */
export async function loadSessionUser(db: Database, id: string): Promise<SessionUser | null> {
  const [user] = await db.select().from(users).where(eq(users.id, id));
  if (!user) return null;
  const rows = await db.select().from(memberships).where(eq(memberships.userId, id));
  const projectRoles: Record<string, ProjectRole[]> = {};
  for (const m of rows) (projectRoles[m.projectId] ??= []).push(m.role);
  return { id: user.id, email: user.email, name: user.name, isAdmin: user.isAdmin, projectRoles };
}

/** Users for the admin screen, without password data, each with their roles as "role in project code". */
export async function listUsers(db: Database) {
  const people = await db
    .select({ id: users.id, email: users.email, name: users.name, isAdmin: users.isAdmin, createdAt: users.createdAt })
    .from(users)
    .orderBy(users.name);
  const roles = await db
    .select({ userId: memberships.userId, role: memberships.role, projectCode: projects.code })
    .from(memberships)
    .innerJoin(projects, eq(projects.id, memberships.projectId))
    .orderBy(projects.code, memberships.role);
  return people.map((p) => ({ ...p, roles: roles.filter((r) => r.userId === p.id).map(({ role, projectCode }) => ({ role, projectCode })) }));
}
