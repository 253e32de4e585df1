import { beforeAll, describe, expect, it } from 'vitest';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoSessions, drive, json, prepareForSubmit, readyDraft, send } from '../helpers/workflow-api';
import { makeOutsider, type Outsider } from './outsider.fixture';

// Copying a study (within its project and into another) and starting revision n+1 from any
// issued revision, against the real server and database.

let sessions: Record<DemoRole, HttpSession>;
let outsider: Outsider;
const code = (p: string) => `${p}${process.pid % 1000}-${Date.now() % 100000}`;
const revision = async (s: HttpSession, id: string) => (await json(await s.fetch(`/api/revisions/${id}`), 200)).revision;

beforeAll(async () => {
  sessions = await demoSessions();
  outsider = await makeOutsider();
});

describe('copy a study', () => {
  it('copies the chosen revision’s inputs into a new study of the same project, under the new title', async () => {
    const source = await readyDraft(sessions.designer);
    const original = await revision(sessions.designer, source.revisionId);
    const copy = await json(await send(sessions.designer, 'POST', `/api/studies/${source.studyId}/copy`, { projectId: source.projectId, code: code('CP'), title: 'Copied route' }), 201);
    expect(copy.study.id).not.toBe(source.studyId);
    expect(copy.revision).toMatchObject({ number: 1, state: 'draft' });
    const copied = await revision(sessions.designer, copy.revision.id);
    expect(copied.inputs).toEqual({ ...original.inputs, title: 'Copied route' });
    expect(copied.results).toBeNull();
    // The same code again is refused on the code field; nothing is half made.
    const again = await json(await send(sessions.designer, 'POST', `/api/studies/${source.studyId}/copy`, { projectId: source.projectId, code: copy.study.code, title: 'Copied route' }), 409);
    expect(again.fields[0].field).toBe('code');
  });

  it('copies into another project only for a designer there', async () => {
    const source = await readyDraft(sessions.designer);
    // The demo designer is no designer in the outsider's project.
    const refused = await send(sessions.designer, 'POST', `/api/studies/${source.studyId}/copy`, { projectId: outsider.projectId, code: code('X'), title: 'Elsewhere' });
    expect(refused.status).toBe(403);
    // The outsider cannot read the source study.
    const unseen = await send(outsider.session, 'POST', `/api/studies/${source.studyId}/copy`, { projectId: outsider.projectId, code: code('X'), title: 'Elsewhere' });
    expect(unseen.status).toBe(403);
    // The outsider copies their own study into their own project.
    const own = await json(await send(outsider.session, 'POST', `/api/studies/${outsider.studyId}/copy`, { projectId: outsider.projectId, code: code('O'), title: 'Outsider copy' }), 201);
    expect(own.study.projectId).toBe(outsider.projectId);
  });

  it('refuses a revision of another study, naming the field', async () => {
    const a = await readyDraft(sessions.designer);
    const b = await readyDraft(sessions.designer);
    const res = await json(await send(sessions.designer, 'POST', `/api/studies/${a.studyId}/copy`, { projectId: a.projectId, code: code('Y'), title: 'Wrong source', fromRevisionId: b.revisionId }), 422);
    expect(res.fields[0].field).toBe('fromRevisionId');
  });
});

describe('revision n+1 from any issued revision', () => {
  it('starts revision 3 from issued revision 1, not from the latest', async () => {
    const first = await readyDraft(sessions.designer);
    const issue: Array<[DemoRole, string]> = [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']];
    await drive(sessions, first.revisionId, issue);
    const second = await json(await send(sessions.designer, 'POST', `/api/studies/${first.studyId}/revisions`), 201);
    const changed = { ...(await revision(sessions.designer, second.id)).inputs, soilResistivityOhmM: 333 };
    await json(await send(sessions.designer, 'PUT', `/api/revisions/${second.id}/inputs`, { version: 1, inputs: changed }), 200);
    // While revision 2 is open, no revision starts, from any revision.
    expect((await send(sessions.designer, 'POST', `/api/studies/${first.studyId}/revisions`, { fromRevisionId: first.revisionId })).status).toBe(422);
    await json(await send(sessions.designer, 'POST', `/api/revisions/${second.id}/calculate`), 200);
    await prepareForSubmit(sessions.designer, second.id);
    await drive(sessions, second.id, issue);
    const refused = await json(await send(sessions.designer, 'POST', `/api/studies/${first.studyId}/revisions`, { fromRevisionId: '00000000-0000-4000-8000-000000000000' }), 422);
    expect(refused.fields[0].field).toBe('fromRevisionId');

    const third = await json(await send(sessions.designer, 'POST', `/api/studies/${first.studyId}/revisions`, { fromRevisionId: first.revisionId }), 201);
    expect(third.number).toBe(3);
    expect(third.basedOnId).toBe(first.revisionId);
    const r1 = await revision(sessions.designer, first.revisionId);
    const r3 = await revision(sessions.designer, third.id);
    expect(r3.inputs).toEqual(r1.inputs);
    expect(r3.inputs.soilResistivityOhmM).not.toBe(333);
  });
});
