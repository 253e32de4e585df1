import { assign, setup } from 'xstate';

// The revision lifecycle, shared by the server (the authority) and the islands (which only ask
// `snapshot.can(event)` to enable buttons). Guards are pure: the server gathers the facts they
// need (results current, checklist complete ...) and passes them in the event.

export const REVISION_MACHINE_VERSION = 2;

export const revisionStates = ['draft', 'ready_for_check', 'in_check', 'returned', 'checked', 'issued', 'withdrawn', 'superseded'] as const;
export type RevisionState = (typeof revisionStates)[number];

export type WorkflowRole = 'designer' | 'checker' | 'approver' | 'auditor';

export interface WorkflowActor {
  userId: string;
  /** The actor's roles in the revision's project. */
  roles: WorkflowRole[];
}

/** Facts about the revision that the server establishes before applying an event. */
export interface RevisionFacts {
  /** Inputs hash equals the results' hash, and a fresh recomputation gives the same figures. */
  resultsCurrent: boolean;
  /** Every computed checklist item has a verdict against a limit. */
  computedEvaluated: boolean;
  /** Every manual checklist item is answered (yes / no / not applicable with a reason). */
  manualAnswered: boolean;
  /** Every check value is within tolerance or explained. */
  checkValuesSettled: boolean;
  /** Every failing item is resolved or carries the approver's justification. */
  failuresJustified: boolean;
  /** Failing computed items without the designer's justification. */
  failuresUnexplained: number;
  /** Checklist items the checker has queried and not yet agreed. */
  queriedItems: number;
  /** Remark threads not yet closed. */
  openRemarkThreads: number;
  /** The actor gave a reason (for a return or a withdrawal). */
  reasonGiven: boolean;
}

/** Facts that let every guard through: the islands use them to offer steps (the server has the last word). */
export const ASSUME_READY: RevisionFacts = {
  resultsCurrent: true,
  computedEvaluated: true,
  manualAnswered: true,
  checkValuesSettled: true,
  failuresJustified: true,
  failuresUnexplained: 0,
  queriedItems: 0,
  openRemarkThreads: 0,
  reasonGiven: true,
};

const items = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

export interface RevisionContext {
  designerId: string;
  checkerId: string | null;
  approverId: string | null;
}

type UserEventType = 'revision.submit' | 'revision.startCheck' | 'revision.return' | 'revision.pass' | 'revision.issue' | 'revision.withdraw';
export type RevisionEvent =
  | { type: UserEventType; actor: WorkflowActor; facts: RevisionFacts }
  | { type: 'revision.supersede' };

export type UserEvent = Extract<RevisionEvent, { actor: WorkflowActor }>;

const has = (e: UserEvent, role: WorkflowRole) => e.actor.roles.includes(role);

/** Why a step is refused: the person may not take it (`role`), or the revision is not ready for it (`precondition`). */
export interface Refusal {
  rule: 'role' | 'precondition';
  message: string;
}

const role = (message: string): Refusal => ({ rule: 'role', message });
const notReady = (message: string): Refusal => ({ rule: 'precondition', message });

/**
 * Why an actor may not apply a user event in a state, or null when the rules allow it. One
 * function serves the machine's guards and the server's refusal messages.
 */
export function refusal(state: RevisionState, context: RevisionContext, event: UserEvent): Refusal | null {
  const { actor, facts } = event;
  const me = actor.userId;
  switch (event.type) {
    case 'revision.submit':
      if (me !== context.designerId) return role('Only the designer of this revision can submit it for check.');
      if (!has(event, 'designer')) return role('Submitting needs the designer role in this project.');
      if (!facts.resultsCurrent) return notReady('The results are not current: calculate again after the last change of inputs.');
      if (!facts.computedEvaluated) return notReady('Some computed checklist items have no verdict yet: calculate again.');
      if (!facts.manualAnswered) return notReady('Answer every manual checklist item (yes, no, or not applicable with a reason) before submitting.');
      if (facts.failuresUnexplained > 0) return notReady(`${items(facts.failuresUnexplained, 'failing computed item needs', 'failing computed items need')} your justification before submitting: say on each why the result is acceptable, or change the design.`);
      return null;
    case 'revision.startCheck':
      if (!has(event, 'checker')) return role('Checking needs the checker role in this project.');
      if (me === context.designerId) return role('You designed this revision, so someone else must check it.');
      return null;
    case 'revision.pass':
      if (me !== context.checkerId) return role('Only the checker who took this revision can pass it.');
      if (!facts.resultsCurrent) return notReady('The results are not current: the server could not reproduce them.');
      if (!facts.computedEvaluated) return notReady('Some computed checklist items have no verdict.');
      if (!facts.manualAnswered) return notReady('Some manual checklist items are not answered.');
      if (!facts.checkValuesSettled) return notReady('A check value is outside its tolerance without an explanation: explain it, correct it or delete it.');
      if (facts.queriedItems > 0) return notReady(`${items(facts.queriedItems, 'checklist item is', 'checklist items are')} still queried: close each query once answered, or return the revision to the designer.`);
      if (facts.openRemarkThreads > 0) return notReady(`${items(facts.openRemarkThreads, 'remark thread is', 'remark threads are')} still open: close each once answered, or return the revision to the designer.`);
      return null;
    case 'revision.return':
      if (state === 'in_check' && me !== context.checkerId) return role('Only the checker who took this revision can return it.');
      if (state === 'checked') {
        if (!has(event, 'approver')) return role('Returning a checked revision needs the approver role.');
        if (me === context.designerId || me === context.checkerId) return role('You designed or checked this revision, so you cannot act as its approver.');
      }
      if (!facts.reasonGiven) return notReady('Say why the revision goes back: the reason is kept as a remark.');
      return null;
    case 'revision.issue':
      if (!has(event, 'approver')) return role('Issuing needs the approver role in this project.');
      if (me === context.designerId || me === context.checkerId) return role('You designed or checked this revision, so you cannot approve it.');
      if (!facts.resultsCurrent) return notReady('The results are not current: the server could not reproduce them.');
      if (!facts.failuresJustified) return notReady('A failing checklist item has neither been resolved nor justified by the approver.');
      if (facts.openRemarkThreads > 0) return notReady(`${items(facts.openRemarkThreads, 'remark thread is', 'remark threads are')} still open: close each once answered, or return the revision.`);
      return null;
    case 'revision.withdraw':
      if (me !== context.designerId) return role('Only the designer of this revision can withdraw it.');
      if (!facts.reasonGiven) return notReady('Say why the revision is withdrawn: the reason is kept in its history.');
      return null;
  }
}

const allowed = ({ context, event }: { context: RevisionContext; event: RevisionEvent }, state: RevisionState) =>
  event.type !== 'revision.supersede' && refusal(state, context, event) === null;

export const revisionMachine = setup({
  types: {
    context: {} as RevisionContext,
    events: {} as RevisionEvent,
    input: {} as { designerId: string },
  },
  guards: {
    mayFromDraft: (a) => allowed(a, 'draft'),
    mayFromReturned: (a) => allowed(a, 'returned'),
    mayFromReady: (a) => allowed(a, 'ready_for_check'),
    mayFromInCheck: (a) => allowed(a, 'in_check'),
    mayFromChecked: (a) => allowed(a, 'checked'),
  },
  actions: {
    recordChecker: assign({ checkerId: ({ event }) => ('actor' in event ? event.actor.userId : null) }),
    recordApprover: assign({ approverId: ({ event }) => ('actor' in event ? event.actor.userId : null) }),
    clearCheck: assign({ checkerId: null, approverId: null }),
  },
}).createMachine({
  id: 'revision',
  initial: 'draft',
  context: ({ input }) => ({ designerId: input.designerId, checkerId: null, approverId: null }),
  states: {
    draft: {
      on: {
        'revision.submit': { target: 'ready_for_check', guard: 'mayFromDraft' },
        'revision.withdraw': { target: 'withdrawn', guard: 'mayFromDraft' },
      },
    },
    returned: {
      on: {
        'revision.submit': { target: 'ready_for_check', guard: 'mayFromReturned', actions: 'clearCheck' },
        'revision.withdraw': { target: 'withdrawn', guard: 'mayFromReturned' },
      },
    },
    ready_for_check: {
      on: {
        'revision.startCheck': { target: 'in_check', guard: 'mayFromReady', actions: 'recordChecker' },
        'revision.withdraw': { target: 'withdrawn', guard: 'mayFromReady' },
      },
    },
    in_check: {
      on: {
        'revision.pass': { target: 'checked', guard: 'mayFromInCheck' },
        'revision.return': { target: 'returned', guard: 'mayFromInCheck' },
        'revision.withdraw': { target: 'withdrawn', guard: 'mayFromInCheck' },
      },
    },
    checked: {
      on: {
        'revision.issue': { target: 'issued', guard: 'mayFromChecked', actions: 'recordApprover' },
        'revision.return': { target: 'returned', guard: 'mayFromChecked' },
        'revision.withdraw': { target: 'withdrawn', guard: 'mayFromChecked' },
      },
    },
    issued: { on: { 'revision.supersede': { target: 'superseded' } } },
    withdrawn: { type: 'final' },
    superseded: { type: 'final' },
  },
});

/** The machine's snapshot for a stored revision. */
export function revisionSnapshot(state: RevisionState, context: RevisionContext) {
  return revisionMachine.resolveState({ value: state, context });
}

/** States in which the inputs may still change. */
export const editableStates: ReadonlySet<RevisionState> = new Set(['draft', 'returned']);
