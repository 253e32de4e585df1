import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { and, eq, sql } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents, recomputations, revisions } from '../../src/lib/db/schema';
import { ENGINE_VERSION, calculateStudy } from '../../src/lib/calc';
import { canonicalJson } from '../../src/lib/canonical-json';
import { compactResults } from '../../src/lib/studies/stored-results';
import { bondingStudySchema } from '../../src/lib/schemas/bonding-study.schema';
import { crossBondedRoute } from '../../bench/reference-routes';
import { demoManualItems } from '../../scripts/demo-manual-items';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoIds, demoSessions, fixtureInputs, json, prepareForSubmit, readyDraft, send, step } from '../helpers/workflow-api';
import { figure, percentile, timed } from './figures';

// Calculation runs in worker threads (src/lib/compute): a long route never holds up the request
// thread. Results computed there must be the core's, figure for figure.

let sessions: Record<DemoRole, HttpSession>;
const { db, pool } = createDatabase(testEnv().databaseUrl, 2);

beforeAll(async () => {
  sessions = await demoSessions();
});
afterAll(() => pool.end());

/** A long cross-bonded route (invented, benchmark family) made distinct by its number of major sections. */
const largeRoute = (majorSections: number) => ({ ...crossBondedRoute({ circuits: 2, majorSections, withEcc: true }), title: `off-thread test route, ${majorSections} major sections` });

async function createStudy(inputs: unknown, code: string) {
  const { projectId, limitSetId } = await demoIds(sessions.designer);
  const created = await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/studies`, { code, title: 'Off-thread calculation test', kind: 'bonding', limitSetId, inputs }), 201);
  return created.revision.id as string;
}

describe('calculation off the request thread', () => {
  it('keeps health requests fast while ten large recomputations are in flight, with the in-thread results', { timeout: 240_000 }, async () => {
    const stamp = `${process.pid % 1000}${Date.now() % 100000}`;
    const routes = Array.from({ length: 10 }, (_, i) => largeRoute(40 + i));
    const ids = await Promise.all(routes.map((inputs, i) => createStudy(inputs, `OT${stamp}-${i}`)));

    // Before: how long health takes on this machine with nothing in flight (for the printout).
    const idle: number[] = [];
    for (let i = 0; i < 20; i++) idle.push((await timed(() => sessions.designer.fetch('/api/health'))).ms);

    let inFlight = ids.length;
    const calculations = ids.map(async (id) => {
      const res = await send(sessions.designer, 'POST', `/api/revisions/${id}/calculate`);
      inFlight--;
      return res;
    });
    const busy: number[] = [];
    // Sample while every calculation is still running or queued; each sample waits for the previous.
    while (inFlight > 0 && busy.length < 200) {
      const t = await timed(() => sessions.designer.fetch('/api/health'));
      expect(t.status).toBe(200);
      await t.response.arrayBuffer();
      if (inFlight > 0) busy.push(t.ms);
      await new Promise((r) => setTimeout(r, 25));
    }
    for (const res of await Promise.all(calculations)) expect(res.status, await res.clone().text()).toBe(200);

    figure('health p50 idle', percentile(idle, 50).toFixed(1), 'ms');
    figure('health p95 idle', percentile(idle, 95).toFixed(1), 'ms');
    figure('health p50 with ten large calculations in flight', percentile(busy, 50).toFixed(1), 'ms');
    figure('health p95 with ten large calculations in flight', percentile(busy, 95).toFixed(1), 'ms');
    figure('health samples taken while calculating', busy.length);
    expect(busy.length).toBeGreaterThanOrEqual(5);
    // Target 50 ms (issue 12). The bound is loose for a busy shared 2-core machine: 250 ms, or
    // 2.5 times the idle p95 when the machine is so loaded that health alone is slow. Ten
    // calculations queued on the request thread (a quarter of a second and more each) hold a
    // health request for seconds, far past either.
    const bound = Math.max(250, 2.5 * percentile(idle, 95));
    figure('health p95 bound applied', bound.toFixed(0), 'ms');
    expect(percentile(busy, 95)).toBeLessThan(bound);

    for (const [i, id] of ids.entries()) {
      const [row] = await db.select({ results: revisions.results, engineVersion: revisions.engineVersion }).from(revisions).where(eq(revisions.id, id));
      const inThread = compactResults(calculateStudy(bondingStudySchema.parse(routes[i])));
      expect(row.engineVersion).toBe(ENGINE_VERSION);
      expect(canonicalJson(row.results)).toBe(canonicalJson(inThread));
    }
  });

  it('stores results without route profiles and draws a profile equal to the core\'s on request', async () => {
    const inputs = largeRoute(3);
    const revisionId = await createStudy(inputs, `OP${process.pid % 1000}${Date.now() % 100000}`);
    await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200);
    const detail = await json(await sessions.auditor.fetch(`/api/revisions/${revisionId}`), 200);
    expect(detail.revision.results.cases.every((c: { profile?: unknown }) => c.profile === undefined)).toBe(true);

    const full = calculateStudy(bondingStudySchema.parse(inputs));
    if (full.kind !== 'bonding') throw new Error('a bonding study');
    const answer = await json(await sessions.auditor.fetch(`/api/revisions/${revisionId}/profile?caseId=FEa`), 200);
    expect(answer.recomputed).toBe(true);
    expect(canonicalJson(answer.profile)).toBe(canonicalJson(full.cases.find((c) => c.caseId === 'FEa')!.profile));
    expect(await json(await sessions.auditor.fetch(`/api/revisions/${revisionId}/profile?caseId=NOPE`), 404)).toMatchObject({ error: 'NotFound' });
    expect(await json(await sessions.auditor.fetch(`/api/revisions/${revisionId}/profile`), 422)).toMatchObject({ fields: [{ field: 'caseId' }] });

    // A revision stored before profiles were left out keeps them, and they are served as stored.
    await db.update(revisions).set({ results: full }).where(eq(revisions.id, revisionId));
    const old = await json(await sessions.auditor.fetch(`/api/revisions/${revisionId}/profile?caseId=N`), 200);
    expect(old.recomputed).toBe(false);
    expect(canonicalJson(old.profile)).toBe(canonicalJson(full.cases.find((c) => c.caseId === 'N')!.profile));
  });

  it('a hand-off compares with the recorded recomputation, and still refuses altered results', async () => {
    const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'R');
    const [revision] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
    const known = await db.select().from(recomputations).where(and(eq(recomputations.inputsHash, revision.inputsHash), eq(recomputations.engineVersion, ENGINE_VERSION)));
    expect(known).toHaveLength(1);

    // One figure of the stored results changes: the recorded hash no longer matches.
    await db.execute(sql`update revisions set results = jsonb_set(results, '{cases,0,points,0,maxV}', '12345.6') where id = ${revisionId}`);
    expect(await json(await step(sessions.designer, revisionId, 'submit'), 422)).toMatchObject({ message: expect.stringContaining('results are not current') });
    // Without the record, the core runs again and finds the same.
    await db.delete(recomputations).where(eq(recomputations.inputsHash, revision.inputsHash));
    expect(await json(await step(sessions.designer, revisionId, 'submit'), 422)).toMatchObject({ message: expect.stringContaining('results are not current') });
    expect(await db.select().from(recomputations).where(eq(recomputations.inputsHash, revision.inputsHash))).toHaveLength(1);

    // Calculating again finds the stored figures unlike the recorded ones, so it calculates afresh.
    await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200);
    const [restored] = await db.select({ results: revisions.results }).from(revisions).where(eq(revisions.id, revisionId));
    expect(canonicalJson(restored.results)).toBe(canonicalJson(revision.results));
    const calculatedEvents = () => db.select({ detail: auditEvents.detail }).from(auditEvents).where(and(eq(auditEvents.revisionId, revisionId), eq(auditEvents.type, 'revision.calculated'))).orderBy(sql`${auditEvents.id} desc`);
    const [afterFresh] = await db.select({ version: revisions.version, limitSetVersionId: revisions.limitSetVersionId }).from(revisions).where(eq(revisions.id, revisionId));
    const eventsBefore = (await calculatedEvents()).length;
    // Unchanged inputs, engine and limit set, and intact results: nothing would change, so nothing is written.
    expect(await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200)).toMatchObject({ unchanged: true, version: afterFresh.version, inputsHash: revision.inputsHash });
    expect(await db.select({ version: revisions.version }).from(revisions).where(eq(revisions.id, revisionId))).toEqual([{ version: afterFresh.version }]);
    expect(await calculatedEvents()).toHaveLength(eventsBefore);
    // A new version of the limit set: the stored results are kept and the limit set is applied again.
    const { limitSetId } = await demoIds(sessions.designer);
    const published = await json(await send(sessions.admin, 'POST', `/api/admin/limit-sets/${limitSetId}/versions`, { limits: JSON.parse(readFileSync('tests/fixtures/limit-sets/demo-owner.json', 'utf8')).limits, manualItems: demoManualItems, checkTolerancePct: 2 }), 201);
    expect(await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200)).toMatchObject({ unchanged: false, version: afterFresh.version + 1 });
    const events = await calculatedEvents();
    expect(events).toHaveLength(eventsBefore + 1);
    expect(events[1].detail).not.toHaveProperty('resultsReused');
    expect(events[0].detail).toMatchObject({ resultsReused: true, inputsHash: revision.inputsHash, limitSetVersion: published.version });
    const [reapplied] = await db.select({ limitSetVersionId: revisions.limitSetVersionId }).from(revisions).where(eq(revisions.id, revisionId));
    expect(reapplied.limitSetVersionId).not.toBe(afterFresh.limitSetVersionId);
    // Stored figures altered behind the application's back are never taken as up to date.
    await db.execute(sql`update revisions set results = jsonb_set(results, '{cases,0,points,0,maxV}', '12345.6') where id = ${revisionId}`);
    expect(await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200)).toMatchObject({ unchanged: false });
    const [healed] = await db.select({ results: revisions.results }).from(revisions).where(eq(revisions.id, revisionId));
    expect(canonicalJson(healed.results)).toBe(canonicalJson(revision.results));
    await prepareForSubmit(sessions.designer, revisionId);
    await json(await step(sessions.designer, revisionId, 'submit'), 200);
  });

  it('refuses a step on its cheap conditions before any recomputation', async () => {
    const revisionId = await createStudy(fixtureInputs('fernhollow-cross-bonded'), `OQ${process.pid % 1000}${Date.now() % 100000}`);
    await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200);
    const [revision] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
    await db.delete(recomputations).where(eq(recomputations.inputsHash, revision.inputsHash));
    // The manual questions are unanswered: submit is refused without calculating (no recomputation recorded).
    expect(await json(await step(sessions.designer, revisionId, 'submit'), 422)).toMatchObject({ error: 'StepRefused' });
    expect(await db.select().from(recomputations).where(eq(recomputations.inputsHash, revision.inputsHash))).toHaveLength(0);
    // Answered, the same step recomputes (and records it) and goes through.
    await prepareForSubmit(sessions.designer, revisionId);
    await json(await step(sessions.designer, revisionId, 'submit'), 200);
    expect(await db.select().from(recomputations).where(eq(recomputations.inputsHash, revision.inputsHash))).toHaveLength(1);
  });
});
