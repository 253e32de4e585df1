import { describe, expect, it } from 'vitest';
import { demoIds, demoSessions, drive, fixtureInputs, json, readyDraft, send } from '../helpers/workflow-api';

// Each of these answered 500 once; each must be a 4xx that names the field, with nothing written.
describe('bad input is refused by field, never with a 500', () => {
  it('an unknown limit set, a remark replying into another revision, U+0000 and out-of-range numbers', async () => {
    const sessions = await demoSessions();
    const { projectId } = await demoIds(sessions.designer);
    const inputs = fixtureInputs('kestrel-single-point-ecc');
    const unknownSet = await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/studies`, { code: `X${Date.now() % 100000}`, title: 'Unknown limit set', kind: 'bonding', limitSetId: '00000000-0000-4000-8000-000000000000', inputs }), 422);
    expect(unknownSet.fields).toEqual([{ field: 'limitSetId', message: expect.stringContaining('no limit set') }]);

    const a = await readyDraft(sessions.designer, 'kestrel-single-point-ecc', 'X');
    const b = await readyDraft(sessions.designer, 'kestrel-single-point-ecc', 'X');
    const remark = await json(await send(sessions.designer, 'POST', `/api/revisions/${a.revisionId}/remarks`, { body: 'On revision A.' }), 201);
    const crossed = await json(await send(sessions.designer, 'POST', `/api/revisions/${b.revisionId}/remarks`, { body: 'Reply placed on B.', parentId: remark.id }), 422);
    expect(crossed.fields[0].field).toBe('parentId');

    const nul = await json(await send(sessions.designer, 'POST', `/api/revisions/${a.revisionId}/remarks`, { body: 'null \u0000 byte' }), 422);
    expect(nul.fields[0].field).toBe('body');
    const surrogate = await json(await send(sessions.designer, 'PUT', `/api/revisions/${a.revisionId}/inputs`, { version: 1, inputs: { ...inputs, title: 'half \uD83D' } }), 422);
    expect(surrogate.fields[0].field).toBe('inputs.title');

    await drive(sessions, a.revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
    const detail = await json(await sessions.checker.fetch(`/api/revisions/${a.revisionId}`), 200);
    const item = detail.checklist.find((i: { kind: string; value: number | null }) => i.kind === 'computed' && i.value !== null);
    for (const checkerValue of [5e-324, 1e300, -1e300]) {
      const res = await send(sessions.checker, 'POST', `/api/revisions/${a.revisionId}/check-values`, { itemKey: item.itemKey, checkerValue });
      expect(res.status, `${checkerValue}: ${await res.clone().text()}`).toBeLessThan(500);
    }
  });

  it('a limit set version without limits is refused', async () => {
    const sessions = await demoSessions();
    const { limitSetId } = await demoIds(sessions.admin);
    const empty = await json(await send(sessions.admin, 'POST', `/api/admin/limit-sets/${limitSetId}/versions`, { limits: {}, manualItems: [], checkTolerancePct: 2 }), 422);
    expect(empty.fields[0]).toEqual({ field: 'limits', message: expect.stringContaining('at least one limit') });
  });

  it('racing creates of one study code, and racing new revisions: one wins, the rest are told why', async () => {
    const sessions = await demoSessions();
    const { projectId, limitSetId } = await demoIds(sessions.designer);
    const code = `RACE${Date.now() % 100000}`;
    const inputs = fixtureInputs('kestrel-single-point-ecc');
    const creates = await Promise.all(Array.from({ length: 10 }, () => send(sessions.designer, 'POST', `/api/projects/${projectId}/studies`, { code, title: 'Raced code', kind: 'bonding', limitSetId, inputs })));
    const createStatuses = creates.map((r) => r.status);
    expect(createStatuses.filter((s) => s === 201)).toHaveLength(1);
    for (const r of creates.filter((c) => c.status !== 201)) {
      expect([409, 422]).toContain(r.status);
      expect((await r.json()).fields[0].field).toBe('code');
    }

    const issued = await readyDraft(sessions.designer);
    await drive(sessions, issued.revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    const starts = await Promise.all(Array.from({ length: 10 }, () => send(sessions.designer, 'POST', `/api/studies/${issued.studyId}/revisions`)));
    const startStatuses = starts.map((r) => r.status);
    expect(startStatuses.filter((s) => s === 201)).toHaveLength(1);
    expect(startStatuses.every((s) => s === 201 || s === 409 || s === 422)).toBe(true);
  });

  it('a study code outside Latin-1 downloads with its name intact (RFC 8187)', async () => {
    const sessions = await demoSessions();
    const { projectId, limitSetId } = await demoIds(sessions.designer);
    const code = `Б${Date.now() % 100000}`;
    const created = await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/studies`, { code, title: 'Cyrillic code', kind: 'bonding', limitSetId, inputs: fixtureInputs('kestrel-single-point-ecc') }), 201);
    await json(await send(sessions.designer, 'POST', `/api/revisions/${created.revision.id}/calculate`), 200);
    const res = await sessions.designer.fetch(`/api/revisions/${created.revision.id}/record`);
    expect(res.status).toBe(200);
    // The name is the project's document number with the study code in it.
    expect(res.headers.get('content-disposition')).toContain(`filename*=UTF-8''`);
    expect(res.headers.get('content-disposition')).toContain(encodeURIComponent(code));
  });
});
