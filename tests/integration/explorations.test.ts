import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents } from '../../src/lib/db/schema';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { readDocx } from '../helpers/docx-text';
import { downloadRecord } from '../helpers/record-download';
import { type DemoRole, demoSessions, drive, json, readyDraft, send } from '../helpers/workflow-api';

// Issue 14 through the HTTP API: run, progress, cancel, refusal, save and the bonding choice.

let sessions: Record<DemoRole, HttpSession>;
const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
let revisionId: string;

beforeAll(async () => {
  sessions = await demoSessions();
  ({ revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'X'));
});
afterAll(() => pool.end());

const base = () => `/api/revisions/${revisionId}/explorations`;
const start = (body: unknown, who: DemoRole = 'designer') => send(sessions[who], 'POST', base(), body);

async function finished(id: string) {
  for (let i = 0; i < 600; i++) {
    const row = await json(await sessions.designer.fetch(`${base()}/${id}`), 200);
    if (row.status !== 'running') return row;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('exploration did not finish in 60 s');
}

describe('explorations', () => {
  it('runs a bonding appraisal and returns every option with the current one marked', async () => {
    const row = await json(await start({ kind: 'appraisal' }), 202);
    expect(row).toMatchObject({ kind: 'appraisal', status: 'running', engineVersion: '2.0.0' });
    const done = await finished(row.id);
    expect(done.status).toBe('done');
    const keys = done.result.rows.map((r: { key: string }) => r.key);
    expect(keys).toEqual(['current', 'solid', 'single-point-start', 'single-point-end', 'single-point-middle', 'cross-bonded', 'mixed']);
    expect(done.result.rows[0].isCurrent).toBe(true);
  });

  it('pushes progress as server-sent events, uncompressed, ending when the run ends', async () => {
    const axes = [{ input: { kind: 'load-current' }, fromValue: 200, toValue: 4000, points: 200 }];
    const row = await json(await start({ kind: 'sweep', axes }), 202);
    const res = await sessions.designer.fetch(`${base()}/${row.id}/events`, { headers: { 'accept-encoding': 'gzip, br' } });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/event-stream/);
    // Compressed, the events would wait in the compressor's buffer.
    expect(res.headers.get('content-encoding')).toBeNull();
    const text = await res.text(); // the server closes the stream after `end`
    const events = [...text.matchAll(/event: (\w+)\ndata: (.*)\n\n/g)].map((m) => ({ event: m[1], data: JSON.parse(m[2]) }));
    const progress = events.filter((e) => e.event === 'progress').map((e) => e.data);
    expect(progress.length).toBeGreaterThan(0);
    // Counts only grow, and the last is the whole grid; then one `end` with the final status.
    progress.forEach((p, i) => i && expect(p.done).toBeGreaterThanOrEqual(progress[i - 1].done));
    expect(progress.at(-1)).toEqual({ status: 'done', done: 200, total: 200 });
    expect(events.at(-1)).toEqual({ event: 'end', data: { status: 'done' } });
    const done = await json(await sessions.designer.fetch(`${base()}/${row.id}`), 200);
    expect(done.status).toBe('done');
    // Another revision's or an unknown id: refused before any stream.
    await json(await sessions.designer.fetch(`${base()}/00000000-0000-4000-8000-000000000000/events`), 404);
  });

  it('refuses a grid over the limit, naming it, with nothing saved', async () => {
    const before = await json(await sessions.designer.fetch(base()), 200);
    const axes = [
      { input: { kind: 'soil-resistivity' }, fromValue: 10, toValue: 1000, points: 50 },
      { input: { kind: 'load-current' }, fromValue: 100, toValue: 2000, points: 50 },
    ];
    const refused = await json(await start({ kind: 'sweep', axes }), 422);
    expect(refused.fields).toEqual([{ field: 'axes', message: 'A sweep of 2,500 grid points is over the limit of 1,000; use fewer points.' }]);
    const bad = await json(await start({ kind: 'sweep', axes: [{ input: { kind: 'depth' }, fromValue: -1, toValue: 2, points: 3 }] }), 422);
    expect(bad.fields[0].field).toBe('axes.0.fromValue');
    const after = await json(await sessions.designer.fetch(base()), 200);
    expect(after.explorations.length).toBe(before.explorations.length);
  });

  it('is cancelled while it runs and stays cancelled', async () => {
    const axes = [
      { input: { kind: 'soil-resistivity' }, fromValue: 10, toValue: 1000, points: 200 },
      { input: { kind: 'earth-resistance', at: 'link-boxes' }, fromValue: 1, toValue: 20, points: 5 },
    ];
    const row = await json(await start({ kind: 'sweep', axes }), 202);
    expect(row.total).toBe(1000);
    const cancelled = await json(await send(sessions.designer, 'POST', `${base()}/${row.id}/cancel`), 200);
    expect(cancelled.status).toBe('cancelled');
    await new Promise((r) => setTimeout(r, 500));
    const later = await json(await sessions.designer.fetch(`${base()}/${row.id}`), 200);
    expect(later.status).toBe('cancelled');
    expect(later.result).toBeNull();
    expect(later.done).toBeLessThan(1000);
    const again = await json(await send(sessions.designer, 'POST', `${base()}/${row.id}/cancel`), 422);
    expect(again.message).toBe('The exploration is cancelled, not running: there is nothing to cancel.');
  });

  it('saves a finished sweep with the revision (audited) and lets readers see it but not run one', async () => {
    const axes = [{ input: { kind: 'soil-resistivity' }, fromValue: 20, toValue: 2000, points: 12 }];
    const row = await json(await start({ kind: 'sweep', axes }), 202);
    const done = await finished(row.id);
    expect(done.status).toBe('done');
    expect(done.done).toBe(12);
    expect(done.result.points).toHaveLength(12);
    expect(done.result.points[0].values).toEqual([20]);
    await json(await send(sessions.checker, 'POST', `${base()}/${row.id}/save`), 403);
    const saved = await json(await send(sessions.designer, 'POST', `${base()}/${row.id}/save`), 200);
    expect(saved.savedAt).toBeTruthy();
    const events = await db.select().from(auditEvents).where(and(eq(auditEvents.revisionId, revisionId), eq(auditEvents.type, 'exploration.saved')));
    expect(events.map((e) => (e.detail as { explorationId: string }).explorationId)).toContain(row.id);
    const list = await json(await sessions.checker.fetch(base()), 200);
    expect(list.explorations.find((e: { id: string }) => e.id === row.id).savedAt).toBeTruthy();
    await json(await start({ kind: 'appraisal' }, 'checker'), 403);
  });

  it('records the chosen bonding option with its reason, only from a saved appraisal', async () => {
    const row = await json(await start({ kind: 'appraisal' }), 202);
    await finished(row.id);
    const unsaved = await json(await send(sessions.designer, 'PUT', `/api/revisions/${revisionId}/bonding-choice`, { explorationId: row.id, optionKey: 'cross-bonded', reason: 'Lowest losses.' }), 422);
    expect(unsaved.fields[0].field).toBe('explorationId');
    await json(await send(sessions.designer, 'POST', `${base()}/${row.id}/save`), 200);
    const noReason = await json(await send(sessions.designer, 'PUT', `/api/revisions/${revisionId}/bonding-choice`, { explorationId: row.id, optionKey: 'cross-bonded', reason: '' }), 422);
    expect(noReason.fields[0].field).toBe('reason');
    const chosen = await json(await send(sessions.designer, 'PUT', `/api/revisions/${revisionId}/bonding-choice`, { explorationId: row.id, optionKey: 'cross-bonded', reason: 'Lowest losses with standing voltages inside the limit.' }), 200);
    expect(chosen.choice).toMatchObject({ optionKey: 'cross-bonded', explorationId: row.id });
    const read = await json(await sessions.checker.fetch(`/api/revisions/${revisionId}/bonding-choice`), 200);
    expect(read.choice.reason).toBe('Lowest losses with standing voltages inside the limit.');
    const events = await db.select().from(auditEvents).where(and(eq(auditEvents.revisionId, revisionId), eq(auditEvents.type, 'bonding.chosen')));
    expect(events).toHaveLength(1);
    // The record carries the choice, the saved appraisal and the sweep saved above.
    const record = readDocx((await downloadRecord(sessions.checker, revisionId)).bytes).bodyText;
    expect(record).toContain('Bonding arrangement chosen: cross-bonded');
    expect(record).toContain('Lowest losses with standing voltages inside the limit.');
    expect(record).toContain('Bonding options appraisal');
    expect(record).toContain('Sensitivity sweep');
  });

  it('accepts a joint-bay placement into a new draft with one audited action', async () => {
    const issued = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'P');
    await drive(sessions, issued.revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    const path = `/api/revisions/${issued.revisionId}/explorations`;
    const row = await json(await send(sessions.designer, 'POST', path, { kind: 'placement', drumLengthM: 2000 }), 202);
    let done = row;
    for (let i = 0; i < 600 && done.status === 'running'; i++) {
      await new Promise((r) => setTimeout(r, 100));
      done = await json(await sessions.designer.fetch(`${path}/${row.id}`), 200);
    }
    expect(done.status).toBe('done');
    const suggested = done.result.placement.majorSections[0].suggestedLengthsM as number[];
    await json(await send(sessions.checker, 'POST', `${path}/${row.id}/accept`), 403);
    const created = await json(await send(sessions.designer, 'POST', `${path}/${row.id}/accept`), 201);
    expect(created.number).toBe(2);
    const next = await json(await sessions.designer.fetch(`/api/revisions/${created.id}`), 200);
    expect(next.revision.state).toBe('draft');
    const ids = done.result.placement.majorSections[0].sectionIds as string[];
    expect(ids.map((id) => next.revision.inputs.sections.find((s: { id: string }) => s.id === id).lengthM)).toEqual(suggested);
    const events = await db.select().from(auditEvents).where(and(eq(auditEvents.revisionId, created.id), eq(auditEvents.type, 'exploration.placement-accepted')));
    expect(events).toHaveLength(1);
    const again = await json(await send(sessions.designer, 'POST', `${path}/${row.id}/accept`), 422);
    expect(again.message).toMatch(/^Revision 2 is still draft/);
  });
});
