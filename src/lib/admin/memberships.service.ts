import { and, eq } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { memberships, projects, users } from '../db/schema';
import type { ProjectRole } from '../db/schema/projects';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';

export async function addMember(s: AppServices, admin: SessionUser, projectId: string, userId: string, role: ProjectRole) {
  const [project] = await s.db.select({ id: projects.id }).from(projects).where(eq(projects.id, projectId));
  if (!project) throw new AppError('NotFound', 'There is no project with this id.');
  const [user] = await s.db.select({ id: users.id }).from(users).where(eq(users.id, userId));
  if (!user) throw new AppError('InvalidInput', undefined, [{ field: 'userId', message: 'There is no such user.' }]);
  return inTransaction(s.pool, async (tx) => {
    await tx.insert(memberships).values({ projectId, userId, role }).onConflictDoNothing();
    await appendAudit(tx, { actorId: admin.id, type: 'membership.added', projectId, detail: { userId, role } });
  });
}

export async function removeMember(s: AppServices, admin: SessionUser, projectId: string, userId: string, role: ProjectRole) {
  return inTransaction(s.pool, async (tx) => {
    const removed = await tx.delete(memberships).where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId), eq(memberships.role, role))).returning();
    if (!removed.length) throw new AppError('NotFound', 'That person does not hold that role in this project.');
    await appendAudit(tx, { actorId: admin.id, type: 'membership.removed', projectId, detail: { userId, role } });
  });
}
