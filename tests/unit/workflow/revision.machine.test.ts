import { describe, expect, it } from 'vitest';
import { transition } from 'xstate';
import {
  ASSUME_READY,
  type RevisionContext,
  type RevisionFacts,
  type RevisionState,
  type UserEvent,
  type WorkflowRole,
  refusal,
  revisionMachine,
  revisionSnapshot,
} from '../../../src/lib/workflow/revision.machine';

const ready: RevisionFacts = ASSUME_READY;
const people: Record<string, WorkflowRole[]> = {
  dan: ['designer'],
  cho: ['checker'],
  abe: ['approver'],
  aud: ['auditor'],
  both: ['designer', 'checker', 'approver'],
  admin: [],
};
const ctx = (over: Partial<RevisionContext> = {}): RevisionContext => ({ designerId: 'dan', checkerId: null, approverId: null, ...over });
const ev = (type: UserEvent['type'], who: string, facts: Partial<RevisionFacts> = {}): UserEvent => ({ type, actor: { userId: who, roles: people[who] }, facts: { ...ready, ...facts } });

function step(state: RevisionState, context: RevisionContext, event: UserEvent) {
  const snapshot = revisionSnapshot(state, context);
  if (!snapshot.can(event)) return { to: null, why: refusal(state, context, event) };
  const [next] = transition(revisionMachine, snapshot, event);
  return { to: next.value as RevisionState, context: next.context };
}

describe('revision lifecycle: allowed transitions', () => {
  const table: Array<[RevisionState, RevisionContext, UserEvent, RevisionState]> = [
    ['draft', ctx(), ev('revision.submit', 'dan'), 'ready_for_check'],
    ['draft', ctx(), ev('revision.withdraw', 'dan'), 'withdrawn'],
    ['ready_for_check', ctx(), ev('revision.startCheck', 'cho'), 'in_check'],
    ['ready_for_check', ctx(), ev('revision.startCheck', 'both'), 'in_check'],
    ['in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'cho'), 'checked'],
    ['in_check', ctx({ checkerId: 'cho' }), ev('revision.return', 'cho'), 'returned'],
    ['returned', ctx({ checkerId: 'cho' }), ev('revision.submit', 'dan'), 'ready_for_check'],
    ['checked', ctx({ checkerId: 'cho' }), ev('revision.issue', 'abe'), 'issued'],
    ['checked', ctx({ checkerId: 'cho' }), ev('revision.return', 'abe'), 'returned'],
    ['checked', ctx({ checkerId: 'cho' }), ev('revision.withdraw', 'dan'), 'withdrawn'],
  ];
  for (const [from, context, event, to] of table) {
    it(`${from} --${event.type} by ${event.actor.userId}--> ${to}`, () => expect(step(from, context, event).to).toBe(to));
  }

  it('records the checker when checking starts and the approver on issue, and clears them on resubmission', () => {
    const started = step('ready_for_check', ctx(), ev('revision.startCheck', 'cho'));
    expect(started.context?.checkerId).toBe('cho');
    const issued = step('checked', ctx({ checkerId: 'cho' }), ev('revision.issue', 'abe'));
    expect(issued.context?.approverId).toBe('abe');
    const resubmitted = step('returned', ctx({ checkerId: 'cho' }), ev('revision.submit', 'dan'));
    expect(resubmitted.context?.checkerId).toBeNull();
  });

  it('an issued revision is superseded only by the system event', () => {
    const [next] = transition(revisionMachine, revisionSnapshot('issued', ctx({ checkerId: 'cho', approverId: 'abe' })), { type: 'revision.supersede' });
    expect(next.value).toBe('superseded');
  });
});

describe('revision lifecycle: every refusal', () => {
  const refusals: Array<[string, RevisionState, RevisionContext, UserEvent, 'role' | 'precondition' | 'state']> = [
    ['someone else submits the designer\'s revision', 'draft', ctx(), ev('revision.submit', 'both'), 'role'],
    ['a designer without the role in this project submits', 'draft', ctx({ designerId: 'admin' }), ev('revision.submit', 'admin'), 'role'],
    ['submit with stale results', 'draft', ctx(), ev('revision.submit', 'dan', { resultsCurrent: false }), 'precondition'],
    ['submit with unevaluated computed items', 'draft', ctx(), ev('revision.submit', 'dan', { computedEvaluated: false }), 'precondition'],
    ['submit with unanswered manual items', 'draft', ctx(), ev('revision.submit', 'dan', { manualAnswered: false }), 'precondition'],
    ['the designer checks their own revision', 'ready_for_check', ctx({ designerId: 'both' }), ev('revision.startCheck', 'both'), 'role'],
    ['an approver without the checker role starts checking', 'ready_for_check', ctx(), ev('revision.startCheck', 'abe'), 'role'],
    ['an auditor starts checking', 'ready_for_check', ctx(), ev('revision.startCheck', 'aud'), 'role'],
    ['another checker passes a revision they did not take', 'in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'both'), 'role'],
    ['pass with results the server cannot reproduce', 'in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'cho', { resultsCurrent: false }), 'precondition'],
    ['pass with a check value out of tolerance and unexplained', 'in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'cho', { checkValuesSettled: false }), 'precondition'],
    ['pass with manual items unanswered', 'in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'cho', { manualAnswered: false }), 'precondition'],
    ['pass with computed items unevaluated', 'in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'cho', { computedEvaluated: false }), 'precondition'],
    ['return without a reason', 'in_check', ctx({ checkerId: 'cho' }), ev('revision.return', 'cho', { reasonGiven: false }), 'precondition'],
    ['another person returns a revision in check', 'in_check', ctx({ checkerId: 'cho' }), ev('revision.return', 'abe'), 'role'],
    ['the checker approves what they checked', 'checked', ctx({ checkerId: 'both' }), ev('revision.issue', 'both'), 'role'],
    ['the designer approves their own revision', 'checked', ctx({ designerId: 'both', checkerId: 'cho' }), ev('revision.issue', 'both'), 'role'],
    ['a checker without the approver role issues', 'checked', ctx({ checkerId: 'x' }), ev('revision.issue', 'cho'), 'role'],
    ['issue with an unjustified failure', 'checked', ctx({ checkerId: 'cho' }), ev('revision.issue', 'abe', { failuresJustified: false }), 'precondition'],
    ['issue with results the server cannot reproduce', 'checked', ctx({ checkerId: 'cho' }), ev('revision.issue', 'abe', { resultsCurrent: false }), 'precondition'],
    ['the checker returns a checked revision as if approver', 'checked', ctx({ checkerId: 'both' }), ev('revision.return', 'both'), 'role'],
    ['a non-approver returns a checked revision', 'checked', ctx({ checkerId: 'cho' }), ev('revision.return', 'cho'), 'role'],
    ['someone other than the designer withdraws', 'draft', ctx(), ev('revision.withdraw', 'cho'), 'role'],
    ['an admin without project roles skips to issue', 'draft', ctx(), ev('revision.issue', 'admin'), 'state'],
    ['an approver skips the check', 'ready_for_check', ctx(), ev('revision.issue', 'abe'), 'state'],
    ['a checker passes before taking the revision', 'ready_for_check', ctx(), ev('revision.pass', 'cho'), 'state'],
    ['anyone changes an issued revision', 'issued', ctx({ checkerId: 'cho', approverId: 'abe' }), ev('revision.withdraw', 'dan'), 'state'],
    ['anyone revives a withdrawn revision', 'withdrawn', ctx(), ev('revision.submit', 'dan'), 'state'],
    ['anyone revives a superseded revision', 'superseded', ctx(), ev('revision.submit', 'dan'), 'state'],
    ['submit with a failing computed item the designer has not justified', 'draft', ctx(), ev('revision.submit', 'dan', { failuresUnexplained: 1 }), 'precondition'],
    ['pass with a queried checklist item', 'in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'cho', { queriedItems: 1 }), 'precondition'],
    ['pass with an open remark thread', 'in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'cho', { openRemarkThreads: 1 }), 'precondition'],
    ['issue with an open remark thread', 'checked', ctx({ checkerId: 'cho' }), ev('revision.issue', 'abe', { openRemarkThreads: 2 }), 'precondition'],
    ['withdraw without a reason', 'draft', ctx(), ev('revision.withdraw', 'dan', { reasonGiven: false }), 'precondition'],
  ];
  for (const [name, state, context, event, kind] of refusals) {
    it(name, () => {
      const result = step(state, context, event);
      expect(result.to).toBeNull();
      if (kind === 'state') expect(revisionMachine.states[state].on?.[event.type as never]).toBeUndefined();
      else {
        expect(result.why?.rule).toBe(kind);
        expect(result.why?.message.length).toBeGreaterThan(20);
      }
    });
  }
});

describe('refusal messages of the new gates name how many', () => {
  it('counts queried items, open threads and unexplained failures in words', () => {
    expect(refusal('in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'cho', { queriedItems: 2 }))?.message).toMatch(/^2 checklist items are still queried/);
    expect(refusal('in_check', ctx({ checkerId: 'cho' }), ev('revision.pass', 'cho', { openRemarkThreads: 1 }))?.message).toMatch(/^1 remark thread is still open/);
    expect(refusal('checked', ctx({ checkerId: 'cho' }), ev('revision.issue', 'abe', { openRemarkThreads: 3 }))?.message).toMatch(/^3 remark threads are still open/);
    expect(refusal('draft', ctx(), ev('revision.submit', 'dan', { failuresUnexplained: 1 }))?.message).toMatch(/^1 failing computed item needs your justification/);
  });
});
