import { and, desc, eq, inArray, ne, or } from 'drizzle-orm';
import type { Database } from '../db/client';
import { projects, revisions, studies } from '../db/schema';
import type { SessionUser } from '../auth/roles';

/** A revision that waited longer than this in someone's queue is shown as overdue. */
export const OVERDUE_DAYS = 5;

const rowShape = {
  revisionId: revisions.id,
  studyCode: studies.code,
  studyTitle: studies.title,
  projectName: projects.name,
  revisionNumber: revisions.number,
  state: revisions.state,
  updatedAt: revisions.updatedAt,
};

/** What waits for the user in each of their roles, and recent activity in their projects. */
export async function myQueue(db: Database, user: SessionUser) {
  const inRole = (role: string) => Object.entries(user.projectRoles).filter(([, r]) => r.includes(role as never)).map(([id]) => id);
  const base = () => db.select(rowShape).from(revisions).innerJoin(studies, eq(studies.id, revisions.studyId)).innerJoin(projects, eq(projects.id, studies.projectId));
  const overdue = (d: Date) => Date.now() - d.getTime() > OVERDUE_DAYS * 86_400_000;
  const mark = <T extends { updatedAt: Date }>(rows: T[]) => rows.map((r) => ({ ...r, overdue: overdue(r.updatedAt) }));

  const waiting = [];
  const designerProjects = inRole('designer');
  if (designerProjects.length) {
    waiting.push({ role: 'designer', label: 'Your drafts and returned revisions', items: mark(await base().where(and(inArray(studies.projectId, designerProjects), eq(revisions.designerId, user.id), inArray(revisions.state, ['draft', 'returned']))).orderBy(revisions.updatedAt)) });
  }
  const checkerProjects = inRole('checker');
  if (checkerProjects.length) {
    waiting.push({
      role: 'checker',
      label: 'Waiting for your check',
      items: mark(
        await base()
          .where(and(inArray(studies.projectId, checkerProjects), or(and(eq(revisions.state, 'ready_for_check'), ne(revisions.designerId, user.id)), and(eq(revisions.state, 'in_check'), eq(revisions.checkerId, user.id)))))
          .orderBy(revisions.updatedAt),
      ),
    });
  }
  const approverProjects = inRole('approver');
  if (approverProjects.length) {
    const rows = await base().where(and(inArray(studies.projectId, approverProjects), eq(revisions.state, 'checked'), ne(revisions.designerId, user.id))).orderBy(revisions.updatedAt);
    waiting.push({ role: 'approver', label: 'Waiting for your approval', items: mark(rows) });
  }
  const all = Object.keys(user.projectRoles);
  const recent = all.length ? mark(await base().where(inArray(studies.projectId, all)).orderBy(desc(revisions.updatedAt)).limit(8)) : [];
  return { waiting, recent };
}
