import { and, eq, isNull } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { checkValues, checklistItems, limitSetVersions, remarks, type ChecklistRow, type Remark, type Revision } from '../db/schema';
import type { Database } from '../db/client';
import { appendAudit } from '../audit/audit-log';
import { assertId, membersWithRole } from '../db/revisions.repo';
import { withLockedRevision } from '../db/revision-lock';
import { editableStates } from '../workflow/revision.machine';
import { manualItemSubject } from '../workflow/manual-item-subjects';
import { workflowMessage } from '../mail/workflow-messages';
import { MAIL_QUEUE } from '../mail/mail-delivery';
import { parseStudyInputs } from './study-input';
import type { agreeRemainingSchema, checkValueSchema, checkValueUpdateSchema, checklistUpdateSchema, remarkSchema } from '../schemas/revision-actions.schema';

const CLOSED = new Set(['issued', 'withdrawn', 'superseded']);

const field = (name: string, message: string) => new AppError('InvalidInput', undefined, [{ field: name, message }]);

/** An approver who may act on this revision: holds the role and neither designed nor checked it. */
function eligibleApprover(actor: SessionUser, projectId: string, revision: Revision): boolean {
  return (actor.projectRoles[projectId] ?? []).includes('approver') && actor.id !== revision.designerId && actor.id !== revision.checkerId;
}

/**
 * Answers a checklist item: the designer answers manual items and justifies failing computed
 * items while drafting; the checker agrees or queries while checking (a query opens a remark
 * thread on the item); the approver justifies a failing item before issue.
 */
export async function updateChecklistItem(s: AppServices, actor: SessionUser, revisionId: string, itemKey: string, body: z.output<typeof checklistUpdateSchema>) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    const [item] = await tx.select().from(checklistItems).where(and(eq(checklistItems.revisionId, revisionId), eq(checklistItems.itemKey, itemKey)));
    if (!item) throw new AppError('NotFound', `The checklist has no item "${itemKey}". Calculate the revision first.`);
    const audit = (type: string, detail: Record<string, unknown>) => appendAudit(tx, { actorId: actor.id, type, projectId: study.projectId, studyId: study.id, revisionId, detail: { itemKey, ...detail } });

    let change: Partial<typeof checklistItems.$inferInsert>;
    if ('answer' in body) {
      if (item.kind !== 'manual') throw field('answer', 'Computed items are answered by the calculation.');
      if (!editableStates.has(revision.state) || revision.designerId !== actor.id) throw new AppError('Forbidden', 'Only the designer answers manual items, while the revision is being drafted.');
      if (item.answerGenerated) throw field('answer', `The study itself answers this question. ${item.answerReason ?? ''}`.trim());
      if (body.answer === 'not-applicable') {
        const subject = manualItemSubject(itemKey, parseStudyInputs(revision.inputs, study.kind));
        if (subject?.exists) throw field('answer', `This study has ${subject.what}, so the question applies: answer yes or no (with a reason for no).`);
      }
      change = { answer: body.answer, answerReason: body.reason ?? null, answeredBy: actor.id, status: 'answered' };
    } else if ('verdict' in body) {
      if (revision.state !== 'in_check' || revision.checkerId !== actor.id) throw new AppError('Forbidden', 'Only the checker of this revision records verdicts, while checking it.');
      if (body.verdict === 'query') {
        if (!body.remark) throw field('remark', 'Write the query: it opens a remark thread that the designer answers.');
        const [remark] = await tx.insert(remarks).values({ revisionId, authorId: actor.id, kind: 'query', itemKey, body: body.remark }).returning();
        await audit('remark.added', { remarkId: remark.id, kind: 'query', body: body.remark });
      } else {
        // Agreeing ends the item's open queries: the checker accepts the answers given.
        const closed = await closeThreads(tx, actor.id, and(eq(remarks.revisionId, revisionId), eq(remarks.itemKey, itemKey), eq(remarks.kind, 'query'), eq(remarks.resolved, false), isNull(remarks.parentId)));
        for (const r of closed) await audit('remark.resolved', { remarkId: r.id });
      }
      change = { checkerVerdict: body.verdict };
    } else if (editableStates.has(revision.state) && actor.id === revision.designerId) {
      if (!(item.kind === 'computed' && item.status === 'fail')) throw field('justification', 'Only a failing computed item needs your justification.');
      change = { designerJustification: body.justification, designerJustifiedBy: actor.id };
    } else {
      if (revision.state !== 'checked') throw new AppError('Forbidden', 'Failing items are justified by the designer while drafting and by the approver once the revision is checked.');
      if (!eligibleApprover(actor, study.projectId, revision)) throw new AppError('Forbidden', 'Only an approver who neither designed nor checked this revision may justify an item.');
      if (!(item.status === 'fail' || item.answer === 'no')) throw field('justification', 'Only a failing item needs a justification.');
      change = { justification: body.justification, justifiedBy: actor.id };
    }

    const [updated] = await tx.update(checklistItems).set(change).where(eq(checklistItems.id, item.id)).returning();
    await audit('checklist.updated', { ...body });
    return updated;
  });
}

/** The checker agrees with every item that has no verdict yet; `count` is what they confirmed. */
export async function agreeWithRemaining(s: AppServices, actor: SessionUser, revisionId: string, body: z.output<typeof agreeRemainingSchema>) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    if (revision.state !== 'in_check' || revision.checkerId !== actor.id) throw new AppError('Forbidden', 'Only the checker of this revision records verdicts, while checking it.');
    const remaining = (await tx.select().from(checklistItems).where(and(eq(checklistItems.revisionId, revisionId), isNull(checklistItems.checkerVerdict)))).map((i) => i.itemKey);
    if (remaining.length !== body.count) {
      throw new AppError('Conflict', `The checklist changed: ${remaining.length} item${remaining.length === 1 ? ' has' : 's have'} no verdict now, not ${body.count}. Look again and confirm.`);
    }
    await tx.update(checklistItems).set({ checkerVerdict: 'agree' }).where(and(eq(checklistItems.revisionId, revisionId), isNull(checklistItems.checkerVerdict)));
    await appendAudit(tx, { actorId: actor.id, type: 'checklist.agreed-remaining', projectId: study.projectId, studyId: study.id, revisionId, detail: { count: remaining.length, itemKeys: remaining } });
    return { agreed: remaining.length };
  });
}

async function closeThreads(tx: Database, actorId: string, where: ReturnType<typeof and>) {
  return tx.update(remarks).set({ resolved: true, closedBy: actorId, closedAt: new Date() }).where(where).returning({ id: remarks.id });
}

/**
 * Adds a remark: a new thread, or a reply in an open thread (how the designer answers). Once
 * the revision is passed, only the approver opens threads, so a passed revision never gains an
 * open remark from anyone else (the lock orders this write against the pass).
 */
export async function addRemark(s: AppServices, actor: SessionUser, revisionId: string, body: z.output<typeof remarkSchema>) {
  return withLockedRevision(s, revisionId, async ({ revision, study, project }, tx, sqlExecutor) => {
    if (CLOSED.has(revision.state)) throw new AppError('ReadOnly');
    if (body.parentId) {
      const [parent] = await tx.select().from(remarks).where(eq(remarks.id, assertId(body.parentId, 'remark')));
      if (parent?.revisionId !== revisionId) throw field('parentId', 'Reply to a remark of this revision.');
      if (parent.parentId) throw field('parentId', 'Reply to the first remark of the thread.');
      if (parent.resolved) throw field('parentId', 'This thread is closed: open a new remark instead.');
    } else if (revision.state === 'checked' && !eligibleApprover(actor, project.id, revision)) {
      throw new AppError('Conflict', 'The revision has been passed: only the approver opens new remarks now. Reply in an open thread instead.');
    }
    const [remark] = await tx
      .insert(remarks)
      // A reply leaves nothing open of its own (resolved), so counting unresolved remarks counts open threads.
      .values({ revisionId, authorId: actor.id, body: body.body, kind: body.parentId ? 'reply' : 'remark', resolved: !!body.parentId, itemKey: body.itemKey ?? null, field: body.field ?? null, parentId: body.parentId ?? null })
      .returning();
    await appendAudit(tx, { actorId: actor.id, type: 'remark.added', projectId: project.id, studyId: study.id, revisionId, detail: { remarkId: remark.id, itemKey: body.itemKey ?? null, field: body.field ?? null, body: body.body, ...(body.parentId ? { replyTo: body.parentId } : {}) } });
    if (s.jobs) {
      const otherIds = actor.id === revision.designerId ? [revision.checkerId, revision.approverId] : [revision.designerId];
      const people = (await membersWithRole(tx, project.id, ['designer', 'checker', 'approver'])).filter((p) => otherIds.includes(p.id));
      const c = { appUrl: s.appUrl, projectName: project.name, studyTitle: study.title, revisionNumber: revision.number, revisionId, actorName: actor.name, reason: body.body };
      await s.jobs.enqueue(sqlExecutor, MAIL_QUEUE, people.map((p) => workflowMessage('remark', c, p.email)));
    }
    return remark;
  });
}

/** Who may close or reopen a thread: its author, the revision's checker, or (once passed) the approver. */
function mayCloseThread(actor: SessionUser, projectId: string, revision: Revision, thread: Remark): boolean {
  return thread.authorId === actor.id || (revision.checkerId === actor.id && revision.state !== 'checked') || (revision.state === 'checked' && eligibleApprover(actor, projectId, revision));
}

/**
 * Closes (resolved) or reopens a remark thread. Closing a query agrees with its item, and
 * reopening it queries the item again. Once passed, only the approver may reopen a thread.
 */
export async function setRemarkResolved(s: AppServices, actor: SessionUser, remarkId: string, resolved: boolean) {
  const [found] = await s.db.select({ revisionId: remarks.revisionId }).from(remarks).where(eq(remarks.id, assertId(remarkId, 'remark')));
  if (!found) throw new AppError('NotFound', 'There is no remark with this id.');
  return withLockedRevision(s, found.revisionId, async ({ revision, study }, tx) => {
    if (CLOSED.has(revision.state)) throw new AppError('ReadOnly');
    const [thread] = await tx.select().from(remarks).where(eq(remarks.id, remarkId));
    if (thread.parentId) throw field('resolved', 'Close or reopen the thread (its first remark), not a reply.');
    if (!mayCloseThread(actor, study.projectId, revision, thread)) {
      throw new AppError('Forbidden', revision.designerId === actor.id ? 'The designer answers a remark with a reply; the checker (or whoever raised it) closes it.' : 'Only whoever raised this remark, the checker of this revision or, once it is passed, the approver may close or reopen it.');
    }
    if (!resolved && revision.state === 'checked' && !eligibleApprover(actor, study.projectId, revision)) {
      throw new AppError('Conflict', 'The revision has been passed: only the approver may reopen a remark now.');
    }
    const [updated] = await tx.update(remarks).set(resolved ? { resolved, closedBy: actor.id, closedAt: new Date() } : { resolved, closedBy: null, closedAt: null }).where(eq(remarks.id, remarkId)).returning();
    if (thread.kind === 'query' && thread.itemKey) await syncQueriedItem(tx, revision.id, thread.itemKey);
    await appendAudit(tx, { actorId: actor.id, type: resolved ? 'remark.resolved' : 'remark.reopened', projectId: study.projectId, studyId: study.id, revisionId: revision.id, detail: { remarkId } });
    return updated;
  });
}

/** An item is queried while it has an open query thread; once its last query closes, the checker agrees. */
async function syncQueriedItem(tx: Database, revisionId: string, itemKey: string) {
  const open = await tx.select({ id: remarks.id }).from(remarks).where(and(eq(remarks.revisionId, revisionId), eq(remarks.itemKey, itemKey), eq(remarks.kind, 'query'), eq(remarks.resolved, false)));
  const [item] = await tx.select().from(checklistItems).where(and(eq(checklistItems.revisionId, revisionId), eq(checklistItems.itemKey, itemKey)));
  if (!item) return;
  const verdict = open.length ? 'query' : item.checkerVerdict === 'query' ? 'agree' : item.checkerVerdict;
  if (verdict !== item.checkerVerdict) await tx.update(checklistItems).set({ checkerVerdict: verdict }).where(eq(checklistItems.id, item.id));
}

/** Percentage deviation of the checker's value from the computed one. */
function deviationPct(checkerValue: number, computedValue: number): number {
  return computedValue === 0 ? (checkerValue === 0 ? 0 : 100) : ((checkerValue - computedValue) / Math.abs(computedValue)) * 100;
}

async function computedItemWithValue(tx: Database, revisionId: string, itemKey: string): Promise<ChecklistRow & { value: number }> {
  const [item] = await tx.select().from(checklistItems).where(and(eq(checklistItems.revisionId, revisionId), eq(checklistItems.itemKey, itemKey)));
  if (!item || item.value === null) throw field('itemKey', 'Choose a computed checklist item with a value.');
  return item as ChecklistRow & { value: number };
}

const mayRecordCheckValues = (actor: SessionUser, revision: Revision) => revision.state === 'in_check' && revision.checkerId === actor.id;

/** Records the checker's own value for a computed result and its deviation. */
export async function addCheckValue(s: AppServices, actor: SessionUser, revisionId: string, body: z.output<typeof checkValueSchema>) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    if (!mayRecordCheckValues(actor, revision)) throw new AppError('Forbidden', 'Only the checker of this revision records check values, while checking it.');
    const item = await computedItemWithValue(tx, revisionId, body.itemKey);
    const [limits] = revision.limitSetVersionId ? await tx.select().from(limitSetVersions).where(eq(limitSetVersions.id, revision.limitSetVersionId)) : [];
    const tolerancePct = limits?.checkTolerancePct ?? 2;
    const deviation = deviationPct(body.checkerValue, item.value);
    const [row] = await tx
      .insert(checkValues)
      .values({ revisionId, checkerId: actor.id, itemKey: body.itemKey, checkerValue: body.checkerValue, computedValue: item.value, deviationPct: deviation, tolerancePct, explanation: body.explanation || null })
      .returning();
    await appendAudit(tx, { actorId: actor.id, type: 'check-value.added', projectId: study.projectId, studyId: study.id, revisionId, detail: { checkValueId: row.id, itemKey: body.itemKey, checkerValue: body.checkerValue, computedValue: item.value, deviationPct: deviation } });
    return row;
  });
}

/** The checker's own value, for a change: only its author, only while checking (until the pass). */
async function ownCheckValue(tx: Database, actor: SessionUser, revision: Revision, checkValueId: string) {
  const [value] = await tx.select().from(checkValues).where(and(eq(checkValues.id, assertId(checkValueId, 'check value')), eq(checkValues.revisionId, revision.id)));
  if (!value) throw new AppError('NotFound', 'There is no check value with this id on this revision.');
  if (value.checkerId !== actor.id) throw new AppError('Forbidden', 'Only the checker who recorded a check value may change or delete it.');
  if (!mayRecordCheckValues(actor, revision)) throw new AppError('Forbidden', 'A check value can be changed or deleted only by its checker while checking, until the revision is passed.');
  return value;
}

/** Corrects the checker's own value or explanation; the deviation is worked out again. */
export async function updateCheckValue(s: AppServices, actor: SessionUser, revisionId: string, checkValueId: string, body: z.output<typeof checkValueUpdateSchema>) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    const before = await ownCheckValue(tx, actor, revision, checkValueId);
    const item = await computedItemWithValue(tx, revisionId, before.itemKey);
    const deviation = deviationPct(body.checkerValue, item.value);
    const [row] = await tx
      .update(checkValues)
      .set({ checkerValue: body.checkerValue, computedValue: item.value, deviationPct: deviation, explanation: body.explanation || null, updatedAt: new Date() })
      .where(eq(checkValues.id, before.id))
      .returning();
    await appendAudit(tx, { actorId: actor.id, type: 'check-value.changed', projectId: study.projectId, studyId: study.id, revisionId, detail: { checkValueId: before.id, itemKey: before.itemKey, from: { checkerValue: before.checkerValue, explanation: before.explanation }, to: { checkerValue: body.checkerValue, explanation: body.explanation || null }, deviationPct: deviation } });
    return row;
  });
}

/** Deletes the checker's own value (kept in the audit trail). */
export async function deleteCheckValue(s: AppServices, actor: SessionUser, revisionId: string, checkValueId: string) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    const before = await ownCheckValue(tx, actor, revision, checkValueId);
    await tx.delete(checkValues).where(eq(checkValues.id, before.id));
    await appendAudit(tx, { actorId: actor.id, type: 'check-value.deleted', projectId: study.projectId, studyId: study.id, revisionId, detail: { checkValueId: before.id, itemKey: before.itemKey, checkerValue: before.checkerValue, computedValue: before.computedValue, explanation: before.explanation } });
    return { deleted: before.id };
  });
}
