import { describe, expect, it } from 'vitest';
import { and, asc, eq } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents, checkValues } from '../../src/lib/db/schema';
import { DEMO_PASSWORD, testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { currentVersion, demoSessions, drive, json, readyDraft, send } from '../helpers/workflow-api';
import { figure } from './figures';

const TRIALS = 3;
const WRITES = 8;

/** Audit events of the given types on a revision that come after its `step` event in the chain. */
async function writesAfter(revisionId: string, step: string, types: string[]) {
  const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
  try {
    const events = await db.select().from(auditEvents).where(eq(auditEvents.revisionId, revisionId)).orderBy(asc(auditEvents.id));
    const stepAt = events.findIndex((e) => e.type === `revision.${step}`);
    return { stepTaken: stepAt >= 0, late: stepAt < 0 ? [] : events.slice(stepAt + 1).filter((e) => types.includes(e.type)) };
  } finally {
    await pool.end();
  }
}

/** Fires `writes` and the step at the same moment; returns the step's status and the writes' statuses. */
async function race(stepper: HttpSession, revisionId: string, step: string, writes: Array<() => Promise<Response>>) {
  const version = await currentVersion(stepper, revisionId);
  // Submit, pass and issue are signed: the password goes with them.
  const all = await Promise.all([send(stepper, 'POST', `/api/revisions/${revisionId}/steps`, { step, version, password: DEMO_PASSWORD }), ...writes.map((w) => w())]);
  return { step: all[0].status, writes: all.slice(1).map((r) => r.status) };
}

describe('writes racing a hand-off never land after it', () => {
  it('designer edits racing submit', async () => {
    const sessions = await demoSessions();
    let lateTotal = 0;
    for (let t = 0; t < TRIALS; t++) {
      const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'L');
      const detail = await json(await sessions.designer.fetch(`/api/revisions/${revisionId}`), 200);
      // Questions the study answers itself ("not applicable") refuse a person's answer.
      const manual = detail.checklist.filter((i: { kind: string; answerGenerated: boolean }) => i.kind === 'manual' && !i.answerGenerated).map((i: { itemKey: string }) => i.itemKey);
      const writes = Array.from({ length: WRITES }, (_, i) => () =>
        send(sessions.designer, 'PUT', `/api/revisions/${revisionId}/checklist/${encodeURIComponent(manual[i % manual.length])}`, { answer: 'yes', reason: `late ${i}` }));
      const result = await race(sessions.designer, revisionId, 'submit', writes);
      expect(result.step).toBe(200);
      // Each write either landed before the submit or was refused; none failed on the server.
      for (const s of result.writes) expect([200, 403, 409]).toContain(s);
      const { late } = await writesAfter(revisionId, 'submit', ['checklist.updated']);
      lateTotal += late.length;
    }
    figure('late designer writes after submit', lateTotal, `in ${TRIALS} trials`);
    expect(lateTotal).toBe(0);
  });

  it('out-of-tolerance check values racing pass: none lands after it, and a passed revision has none unexplained', async () => {
    const sessions = await demoSessions();
    let lateTotal = 0;
    for (let t = 0; t < TRIALS; t++) {
      const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'L');
      await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
      const detail = await json(await sessions.checker.fetch(`/api/revisions/${revisionId}`), 200);
      const item = detail.checklist.find((i: { kind: string; value: number | null }) => i.kind === 'computed' && i.value !== null && i.value !== 0);
      const writes = Array.from({ length: WRITES }, () => () =>
        send(sessions.checker, 'POST', `/api/revisions/${revisionId}/check-values`, { itemKey: item.itemKey, checkerValue: item.value * 1.5 }));
      const result = await race(sessions.checker, revisionId, 'pass', writes);
      for (const s of result.writes) expect([201, 403, 409]).toContain(s);
      const { stepTaken, late } = await writesAfter(revisionId, 'pass', ['check-value.added']);
      lateTotal += late.length;
      if (stepTaken) {
        const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
        try {
          const values = await db.select().from(checkValues).where(eq(checkValues.revisionId, revisionId));
          expect(values.filter((v) => Math.abs(v.deviationPct) > v.tolerancePct && !v.explanation)).toHaveLength(0);
        } finally {
          await pool.end();
        }
      } else {
        // A value outside tolerance landed first, so the guard refused the pass: the right outcome.
        expect(result.step).toBe(422);
      }
    }
    figure('late check values after pass', lateTotal, `in ${TRIALS} trials`);
    expect(lateTotal).toBe(0);
  });

  it('justifications and remarks racing issue: none lands in the issued revision', async () => {
    const sessions = await demoSessions();
    let lateTotal = 0;
    let issued = 0;
    for (let t = 0; t < TRIALS; t++) {
      const { revisionId } = await readyDraft(sessions.designer, 'kestrel-single-point-ecc', 'L');
      await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass']]);
      const detail = await json(await sessions.approver.fetch(`/api/revisions/${revisionId}`), 200);
      const failing = detail.checklist.filter((i: { status: string; answer: string | null }) => i.status === 'fail' || i.answer === 'no');
      expect(failing.length).toBeGreaterThan(0);
      const justify = (text: string) => send(sessions.approver, 'PUT', `/api/revisions/${revisionId}/checklist/${encodeURIComponent(failing[0].itemKey)}`, { justification: text });
      for (const item of failing) {
        await json(await send(sessions.approver, 'PUT', `/api/revisions/${revisionId}/checklist/${encodeURIComponent(item.itemKey)}`, { justification: 'Accepted for this test: the margin is understood.' }), 200);
      }
      // Writes the checked state accepts (the approver's justification, rewritten) and ones it
      // refuses by then (a checker's new remark): neither may land after the issue.
      const writes = Array.from({ length: WRITES }, (_, i) => () =>
        i % 2 ? justify(`Accepted for this test, rewritten ${i}: the margin is understood.`) : send(sessions.checker, 'POST', `/api/revisions/${revisionId}/remarks`, { body: `Late remark ${i}` }));
      const result = await race(sessions.approver, revisionId, 'issue', writes);
      for (const s of result.writes) expect([200, 201, 403, 409]).toContain(s);
      const { stepTaken, late } = await writesAfter(revisionId, 'issue', ['remark.added', 'remark.resolved', 'checklist.updated', 'file.uploaded', 'check-value.added']);
      if (stepTaken) issued++;
      lateTotal += late.length;
    }
    figure('late writes after issue', lateTotal, `in ${TRIALS} trials (${issued} issued)`);
    expect(issued).toBeGreaterThan(0);
    expect(lateTotal).toBe(0);
  });
});
