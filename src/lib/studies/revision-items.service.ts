import { and, eq } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { checkValues, checklistItems, limitSetVersions, remarks } from '../db/schema';
import { appendAudit } from '../audit/audit-log';
import { assertId, membersWithRole } from '../db/revisions.repo';
import { withLockedRevision } from '../db/revision-lock';
import { editableStates } from '../workflow/revision.machine';
import { workflowMessage } from '../mail/workflow-messages';
import { MAIL_QUEUE } from '../mail/mail-delivery';
import type { checkValueSchema, checklistUpdateSchema, remarkSchema } from '../schemas/revision-actions.schema';

const CLOSED = new Set(['issued', 'withdrawn', 'superseded']);

/**
 * Answers a checklist item: the designer answers manual items while drafting, the checker
 * records agree/query while checking, the approver justifies a failing item before issue.
 */
export async function updateChecklistItem(s: AppServices, actor: SessionUser, revisionId: string, itemKey: string, body: z.output<typeof checklistUpdateSchema>) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    const [item] = await tx.select().from(checklistItems).where(and(eq(checklistItems.revisionId, revisionId), eq(checklistItems.itemKey, itemKey)));
    if (!item) throw new AppError('NotFound', `The checklist has no item "${itemKey}". Calculate the revision first.`);

    let change: Partial<typeof checklistItems.$inferInsert>;
    if ('answer' in body) {
      if (item.kind !== 'manual') throw new AppError('InvalidInput', undefined, [{ field: 'answer', message: 'Computed items are answered by the calculation.' }]);
      if (!editableStates.has(revision.state) || revision.designerId !== actor.id) throw new AppError('Forbidden', 'Only the designer answers manual items, while the revision is being drafted.');
      change = { answer: body.answer, answerReason: body.reason ?? null, answeredBy: actor.id, status: 'answered' };
    } else if ('verdict' in body) {
      if (revision.state !== 'in_check' || revision.checkerId !== actor.id) throw new AppError('Forbidden', 'Only the checker of this revision records verdicts, while checking it.');
      change = { checkerVerdict: body.verdict };
    } else {
      if (revision.state !== 'checked') throw new AppError('Forbidden', 'Failing items are justified by the approver once the revision is checked.');
      if (!(actor.projectRoles[study.projectId] ?? []).includes('approver') || actor.id === revision.designerId || actor.id === revision.checkerId) {
        throw new AppError('Forbidden', 'Only an approver who neither designed nor checked this revision may justify an item.');
      }
      if (!(item.status === 'fail' || item.answer === 'no')) throw new AppError('InvalidInput', undefined, [{ field: 'justification', message: 'Only a failing item needs a justification.' }]);
      change = { justification: body.justification, justifiedBy: actor.id };
    }

    const [updated] = await tx.update(checklistItems).set(change).where(eq(checklistItems.id, item.id)).returning();
    await appendAudit(tx, { actorId: actor.id, type: 'checklist.updated', projectId: study.projectId, studyId: study.id, revisionId, detail: { itemKey, ...body } });
    return updated;
  });
}

/** Adds a remark; the other party (designer, or the checker/approver) is told by e-mail. */
export async function addRemark(s: AppServices, actor: SessionUser, revisionId: string, body: z.output<typeof remarkSchema>) {
  return withLockedRevision(s, revisionId, async ({ revision, study, project }, tx, sqlExecutor) => {
    if (CLOSED.has(revision.state)) throw new AppError('ReadOnly');
    if (body.parentId) {
      const [parent] = await tx.select({ revisionId: remarks.revisionId }).from(remarks).where(eq(remarks.id, assertId(body.parentId, 'remark')));
      if (parent?.revisionId !== revisionId) throw new AppError('InvalidInput', undefined, [{ field: 'parentId', message: 'Reply to a remark of this revision.' }]);
    }
    const [remark] = await tx.insert(remarks).values({ revisionId, authorId: actor.id, body: body.body, itemKey: body.itemKey ?? null, field: body.field ?? null, parentId: body.parentId ?? null }).returning();
    await appendAudit(tx, { actorId: actor.id, type: 'remark.added', projectId: project.id, studyId: study.id, revisionId, detail: { remarkId: remark.id, itemKey: body.itemKey ?? null, field: body.field ?? null, body: body.body } });
    if (s.jobs) {
      const otherIds = actor.id === revision.designerId ? [revision.checkerId, revision.approverId] : [revision.designerId];
      const people = (await membersWithRole(tx, project.id, ['designer', 'checker', 'approver'])).filter((p) => otherIds.includes(p.id));
      const c = { appUrl: s.appUrl, projectName: project.name, studyTitle: study.title, revisionNumber: revision.number, revisionId, actorName: actor.name, reason: body.body };
      await s.jobs.enqueue(sqlExecutor, MAIL_QUEUE, people.map((p) => workflowMessage('remark', c, p.email)));
    }
    return remark;
  });
}

/** Marks a remark resolved or open again. */
export async function setRemarkResolved(s: AppServices, actor: SessionUser, remarkId: string, resolved: boolean) {
  const [remark] = await s.db.select({ revisionId: remarks.revisionId }).from(remarks).where(eq(remarks.id, assertId(remarkId, 'remark')));
  if (!remark) throw new AppError('NotFound', 'There is no remark with this id.');
  return withLockedRevision(s, remark.revisionId, async ({ revision, study }, tx) => {
    if (CLOSED.has(revision.state)) throw new AppError('ReadOnly');
    const [updated] = await tx.update(remarks).set({ resolved }).where(eq(remarks.id, remarkId)).returning();
    await appendAudit(tx, { actorId: actor.id, type: resolved ? 'remark.resolved' : 'remark.reopened', projectId: study.projectId, studyId: study.id, revisionId: revision.id, detail: { remarkId } });
    return updated;
  });
}

/** Records the checker's own value for a computed result and its deviation. */
export async function addCheckValue(s: AppServices, actor: SessionUser, revisionId: string, body: z.output<typeof checkValueSchema>) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    if (revision.state !== 'in_check' || revision.checkerId !== actor.id) throw new AppError('Forbidden', 'Only the checker of this revision records check values, while checking it.');
    const [item] = await tx.select().from(checklistItems).where(and(eq(checklistItems.revisionId, revisionId), eq(checklistItems.itemKey, body.itemKey)));
    if (!item || item.value === null) throw new AppError('InvalidInput', undefined, [{ field: 'itemKey', message: 'Choose a computed checklist item with a value.' }]);
    const [limits] = revision.limitSetVersionId ? await tx.select().from(limitSetVersions).where(eq(limitSetVersions.id, revision.limitSetVersionId)) : [];
    const tolerancePct = limits?.checkTolerancePct ?? 2;
    const deviationPct = item.value === 0 ? (body.checkerValue === 0 ? 0 : 100) : ((body.checkerValue - item.value) / Math.abs(item.value)) * 100;
    const [row] = await tx
      .insert(checkValues)
      .values({ revisionId, checkerId: actor.id, itemKey: body.itemKey, checkerValue: body.checkerValue, computedValue: item.value!, deviationPct, tolerancePct, explanation: body.explanation ?? null })
      .returning();
    await appendAudit(tx, { actorId: actor.id, type: 'check-value.added', projectId: study.projectId, studyId: study.id, revisionId, detail: { itemKey: body.itemKey, checkerValue: body.checkerValue, computedValue: item.value, deviationPct } });
    return row;
  });
}
