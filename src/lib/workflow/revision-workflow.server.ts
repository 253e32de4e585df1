import { and, eq, ne, sql } from 'drizzle-orm';
import { transition } from 'xstate';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { remarks, revisions, signOffs } from '../db/schema';
import { withLockedRevision } from '../db/revision-lock';
import type { Database } from '../db/client';
import { appendAudit } from '../audit/audit-log';
import { loadRevisionScope, membersWithRole } from '../db/revisions.repo';
import { workflowMessage, type MessageContext } from '../mail/workflow-messages';
import { MAIL_QUEUE, type OutgoingMail } from '../mail/mail-delivery';
import { enqueueRecords } from '../records/records.service';
import { ASSUME_READY, type UserEvent, type WorkflowRole, refusal, revisionMachine, revisionSnapshot } from './revision.machine';
import { resultsReproduce, revisionFacts } from './revision-facts';
import { resultsHash } from './sign-off';
import { type Reauthentication, reauthenticate } from '../auth/reauthenticate';

export type StepName = 'submit' | 'startCheck' | 'return' | 'pass' | 'issue' | 'withdraw';

export interface StepRequest {
  step: StepName;
  /** The revision version the person saw; a different current version means someone else acted first. */
  version: number;
  reason?: string;
  /** The sign-off statement for submit, pass and issue. */
  statement?: string;
  /** The person's password, asked again for the steps that sign (submit, pass, issue). */
  password?: string;
}

/** Where the request came from and the sign-in policy its password check follows. */
export type SigningContext = Omit<Reauthentication, 'password'>;

const RECOMPUTE: ReadonlySet<StepName> = new Set(['submit', 'pass', 'issue']);
const SIGN_OFF_ROLE: Partial<Record<StepName, 'designer' | 'checker' | 'approver'>> = { submit: 'designer', pass: 'checker', issue: 'approver' };
const DEFAULT_STATEMENT: Record<'designer' | 'checker' | 'approver', string> = {
  designer: 'I prepared this calculation and believe it to be correct and complete.',
  checker: 'I have checked this calculation independently and agree with its results.',
  approver: 'I approve this calculation for issue.',
};

/**
 * Applies a workflow step with the revision machine as the authority: in one transaction that
 * holds the revision's row lock, the guards read fresh facts, then the state, sign-off, audit
 * event and e-mails are written. A stale `version` is a conflict.
 */
export async function applyStep(s: AppServices, actor: SessionUser, revisionId: string, req: StepRequest, signing: SigningContext) {
  // The cheap refusals first, then the password (a bcrypt comparison) and the recomputation
  // (CPU-bound), all before taking the lock: the version check under the lock proves that the
  // inputs they used are still the stored ones.
  const before = await loadRevisionScope(s.db, revisionId);
  if (before.revision.version !== req.version) throw new AppError('Conflict');
  const signRole = SIGN_OFF_ROLE[req.step];
  if (signRole) {
    // A step this person may not take at all is refused before the password is asked for.
    const roles = (actor.projectRoles[before.project.id] ?? []) as WorkflowRole[];
    const early = refusalText(before.revision.state, before.revision, { type: `revision.${req.step}`, actor: { userId: actor.id, roles }, facts: ASSUME_READY });
    if (early && early.kind !== 'StepRefused') throw new AppError(early.kind, early.message);
    await reauthenticate(s, actor, { ...signing, password: req.password });
  }
  let resultsCurrent = true;
  if (RECOMPUTE.has(req.step) && acceptsInState(before.revision.state, `revision.${req.step}`)) {
    // The other guards are cheap reads: a step they refuse is refused before the recomputation
    // (taking results as current), with the same message the locked check would give.
    const roles = (actor.projectRoles[before.project.id] ?? []) as WorkflowRole[];
    const context = { designerId: before.revision.designerId, checkerId: before.revision.checkerId, approverId: before.revision.approverId };
    const facts = await revisionFacts(s.db, before.revision, { resultsCurrent: true, reason: req.reason });
    const early = refusalText(before.revision.state, context, { type: `revision.${req.step}`, actor: { userId: actor.id, roles }, facts });
    if (early) throw new AppError(early.kind, early.message);
    resultsCurrent = await resultsReproduce(s.db, before.revision, before.study);
    // Someone may have acted while this request was checking: a stale request is refused here,
    // without queueing for the row lock (fifty people pressing pass at once).
    const [now] = await s.db.select({ version: revisions.version }).from(revisions).where(eq(revisions.id, revisionId));
    if (now?.version !== req.version) throw new AppError('Conflict');
  }

  return withLockedRevision(s, revisionId, async ({ revision, study, project }, tx, sqlExecutor) => {
    if (revision.version !== req.version) throw new AppError('Conflict');
    const roles = (actor.projectRoles[project.id] ?? []) as WorkflowRole[];
    const facts = await revisionFacts(tx, revision, { resultsCurrent, reason: req.reason });
    const event: UserEvent = { type: `revision.${req.step}`, actor: { userId: actor.id, roles }, facts };
    const context = { designerId: revision.designerId, checkerId: revision.checkerId, approverId: revision.approverId };
    const snapshot = revisionSnapshot(revision.state, context);
    if (!snapshot.can(event)) {
      const reasonText = refusalText(revision.state, context, event) ?? { kind: 'Conflict' as const, message: 'The step was refused.' };
      throw new AppError(reasonText.kind, reasonText.message);
    }
    const [next] = transition(revisionMachine, snapshot, event);
    const to = next.value as typeof revision.state;

    const now = new Date();
    const [updated] = await tx
      .update(revisions)
      .set({
        state: to,
        checkerId: next.context.checkerId,
        approverId: next.context.approverId,
        version: sql`${revisions.version} + 1`,
        updatedAt: now,
        ...(to === 'issued' ? { issuedAt: now } : {}),
      })
      .where(and(eq(revisions.id, revisionId), eq(revisions.version, req.version)))
      .returning();
    if (!updated) throw new AppError('Conflict');

    // The signature covers the locked row's inputs and results (which the guard has just
    // proved current): a later change to either makes it void (sign-off.ts).
    // Hashed once: a long route's results are megabytes of JSON.
    const signedResultsHash = signRole ? resultsHash(revision.results) : null;
    if (signRole) {
      await tx.insert(signOffs).values({ revisionId, userId: actor.id, role: signRole, statement: req.statement?.trim() || DEFAULT_STATEMENT[signRole], inputsHash: revision.inputsHash, resultsHash: signedResultsHash });
    }
    // The reason for a return opens a remark thread: the designer answers it, a checker closes it.
    if (req.step === 'return') await tx.insert(remarks).values({ revisionId, authorId: actor.id, kind: 'return', body: req.reason!.trim() });

    const scope = { projectId: project.id, studyId: study.id };
    await appendAudit(tx, { actorId: actor.id, type: `revision.${req.step}`, ...scope, revisionId, detail: { state: { from: revision.state, to }, version: updated.version, ...(req.reason ? { reason: req.reason } : {}), ...(signRole ? { signed: { role: signRole, inputsHash: revision.inputsHash, resultsHash: signedResultsHash } } : {}) } });

    if (to === 'issued') {
      const replaced = await tx
        .update(revisions)
        .set({ state: 'superseded', version: sql`${revisions.version} + 1`, updatedAt: now })
        .where(and(eq(revisions.studyId, study.id), eq(revisions.state, 'issued'), ne(revisions.id, revisionId)))
        .returning({ id: revisions.id, number: revisions.number });
      for (const r of replaced) {
        await appendAudit(tx, { actorId: actor.id, type: 'revision.supersede', ...scope, revisionId: r.id, detail: { state: { from: 'issued', to: 'superseded' }, supersededBy: revision.number } });
      }
    }

    if (to === 'issued') await enqueueRecords(s.jobs, sqlExecutor, [revisionId]);

    if (s.jobs) {
      const messages = await notifications(tx, req.step, {
        appUrl: s.appUrl,
        projectName: project.name,
        studyTitle: study.title,
        revisionNumber: revision.number,
        revisionId,
        actorName: actor.name,
        reason: req.reason,
      }, project.id, revision.designerId, actor.id);
      await s.jobs.enqueue(sqlExecutor, MAIL_QUEUE, messages);
    }
    return updated;
  });
}

type StateName = Parameters<typeof refusal>[0];

/** The catalogue error for a refused step (a state that has moved on is a conflict), or null when the rules allow it. */
function refusalText(state: StateName, context: Parameters<typeof refusal>[1], event: UserEvent): { kind: 'Forbidden' | 'StepRefused' | 'Conflict'; message: string } | null {
  if (!acceptsInState(state, event.type)) return { kind: 'Conflict', message: `A revision that is ${state.replace(/_/g, ' ')} cannot take the step "${event.type.slice('revision.'.length)}".` };
  const why = refusal(state, context, event);
  if (!why) return null;
  return { kind: why.rule === 'role' ? 'Forbidden' : 'StepRefused', message: why.message };
}

function acceptsInState(state: StateName, type: UserEvent['type']): boolean {
  const node = revisionMachine.states[state];
  return !!node?.on && type in node.on;
}

/** Who hears about a step: submit → checkers, return → designer, pass → approvers, issue → all members. */
async function notifications(tx: Database, step: StepName, c: MessageContext, projectId: string, designerId: string, actorId: string): Promise<OutgoingMail[]> {
  const kind = ({ submit: 'submitted', return: 'returned', pass: 'checked', issue: 'issued' } as const)[step as 'submit'];
  if (!kind) return [];
  const people =
    step === 'submit' ? await membersWithRole(tx, projectId, ['checker'])
      : step === 'pass' ? await membersWithRole(tx, projectId, ['approver'])
        : step === 'issue' ? await membersWithRole(tx, projectId, ['designer', 'checker', 'approver', 'auditor'])
          : (await membersWithRole(tx, projectId, ['designer'])).filter((p) => p.id === designerId);
  return people.filter((p) => p.id !== actorId).map((p) => workflowMessage(kind, c, p.email));
}
