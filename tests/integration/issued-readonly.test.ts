import { beforeAll, describe, expect, it } from 'vitest';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, currentVersion, demoSessions, drive, fixtureInputs, json, prepareForSubmit, readyDraft, send, step } from '../helpers/workflow-api';

describe('an issued revision never changes', () => {
  let sessions: Record<DemoRole, HttpSession>;
  let revisionId: string;
  let before: unknown;

  beforeAll(async () => {
    sessions = await demoSessions();
    ({ revisionId } = await readyDraft(sessions.designer));
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    before = await json(await sessions.designer.fetch(`/api/revisions/${revisionId}`), 200);
  });

  it('refuses every write, whoever tries', async () => {
    const version = await currentVersion(sessions.designer, revisionId);
    const attempts: Array<[HttpSession, string, string, unknown]> = [
      [sessions.designer, 'PUT', `/api/revisions/${revisionId}/inputs`, { version, inputs: fixtureInputs('fernhollow-cross-bonded') }],
      [sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`, undefined],
      [sessions.designer, 'PUT', `/api/revisions/${revisionId}/checklist/${encodeURIComponent('manual:link-boxes')}`, { answer: 'no' }],
      [sessions.checker, 'PUT', `/api/revisions/${revisionId}/checklist/${encodeURIComponent('manual:link-boxes')}`, { verdict: 'query' }],
      [sessions.approver, 'PUT', `/api/revisions/${revisionId}/checklist/${encodeURIComponent('manual:link-boxes')}`, { justification: 'Trying to change an issued record.' }],
      [sessions.checker, 'POST', `/api/revisions/${revisionId}/remarks`, { body: 'A late remark.' }],
      [sessions.checker, 'POST', `/api/revisions/${revisionId}/check-values`, { itemKey: 'standing-voltage-normal:LOAD', checkerValue: 1 }],
    ];
    for (const [who, method, path, body] of attempts) {
      const res = await send(who, method, path, body);
      expect([403, 409], `${method} ${path}`).toContain(res.status);
    }
    for (const [role, name] of [['designer', 'withdraw'], ['approver', 'return'], ['checker', 'pass'], ['designer', 'submit']] as const) {
      const res = await step(sessions[role], revisionId, name, { reason: 'no' });
      expect(res.status, `${role} ${name}`).toBe(409);
    }
    const after = await json(await sessions.designer.fetch(`/api/revisions/${revisionId}`), 200);
    expect(after).toEqual(before);
  });

  it('a change means a new revision that starts from a copy of the inputs, and issuing it supersedes the old one', async () => {
    const detail = await json(await sessions.designer.fetch(`/api/revisions/${revisionId}`), 200);
    const next = await json(await send(sessions.designer, 'POST', `/api/studies/${detail.study.id}/revisions`), 201);
    expect(next.number).toBe(2);
    expect(next.inputs).toEqual(detail.revision.inputs);
    await json(await send(sessions.designer, 'POST', `/api/revisions/${next.id}/calculate`), 200);
    // The designer answers what is theirs to answer; questions the study answers itself stay as the study set them.
    await prepareForSubmit(sessions.designer, next.id);
    await drive(sessions, next.id, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    const old = await json(await sessions.auditor.fetch(`/api/revisions/${revisionId}`), 200);
    expect(old.revision.state).toBe('superseded');
  });
});
