import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { and, eq, isNull } from 'drizzle-orm';
import { demoManualItems } from '../../scripts/demo-manual-items';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents, remarks, revisions } from '../../src/lib/db/schema';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoIds, demoSessions, drive, fixtureInputs, json, prepareForSubmit, readyDraft, send, step } from '../helpers/workflow-api';

// Every gate of issue 11 §1 through the HTTP API: each refusal with its status and message.

let sessions: Record<DemoRole, HttpSession>;
const { db, pool } = createDatabase(testEnv().databaseUrl, 1);

beforeAll(async () => {
  sessions = await demoSessions();
  // Other files publish versions of the demo limit set with fewer questions: this file needs
  // the demo's own (the ECC, SVL and cross-bonding questions), so it publishes them again.
  const { limitSetId } = await demoIds(sessions.designer);
  const limits = JSON.parse(readFileSync('tests/fixtures/limit-sets/demo-owner.json', 'utf8')).limits;
  await json(await send(sessions.admin, 'POST', `/api/admin/limit-sets/${limitSetId}/versions`, { limits, manualItems: demoManualItems, checkTolerancePct: 2 }), 201);
});
afterAll(() => pool.end());

const detail = async (revisionId: string, who: DemoRole = 'designer') => json(await sessions[who].fetch(`/api/revisions/${revisionId}`), 200);
const item = (key: string) => `checklist/${encodeURIComponent(key)}`;
const put = (who: DemoRole, revisionId: string, key: string, body: unknown) => send(sessions[who], 'PUT', `/api/revisions/${revisionId}/${item(key)}`, body);
const remark = (who: DemoRole, revisionId: string, body: Record<string, unknown>) => send(sessions[who], 'POST', `/api/revisions/${revisionId}/remarks`, body);
const close = (who: DemoRole, remarkId: string, resolved = true) => send(sessions[who], 'PATCH', `/api/remarks/${remarkId}`, { resolved });

/** A calculated draft of a fixture with nothing answered yet. */
async function calculatedDraft(fixture: string) {
  const { projectId, limitSetId } = await demoIds(sessions.designer);
  const created = await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/studies`, { code: `G${Date.now() % 1_000_000}${Math.floor(Math.random() * 100)}`, title: `Gates on ${fixture}`, kind: fixtureInputs(fixture).kind, limitSetId, inputs: fixtureInputs(fixture) }), 201);
  await json(await send(sessions.designer, 'POST', `/api/revisions/${created.revision.id}/calculate`), 200);
  return created.revision.id as string;
}

async function inCheck(fixture = 'fernhollow-cross-bonded') {
  const { revisionId } = await readyDraft(sessions.designer, fixture, 'G');
  await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
  return revisionId;
}

describe('manual questions whose subject the study lacks', () => {
  it('are answered "not applicable" by the study with the reason, and cannot be answered by people', async () => {
    const revisionId = await calculatedDraft('fernhollow-cross-bonded');
    const ecc = (await detail(revisionId)).checklist.find((i: { itemKey: string }) => i.itemKey === 'manual:ecc-transposed');
    expect(ecc).toMatchObject({ answer: 'not-applicable', answerGenerated: true, status: 'answered', answerReason: 'Not applicable, set by the study: the study has no single-point bonded section.' });
    const refused = await json(await put('designer', revisionId, 'manual:ecc-transposed', { answer: 'yes' }), 422);
    expect(refused.fields).toEqual([{ field: 'answer', message: 'The study itself answers this question. Not applicable, set by the study: the study has no single-point bonded section.' }]);
  });

  it('questions whose subject exists cannot be answered "not applicable"', async () => {
    const revisionId = await calculatedDraft('kestrel-single-point-ecc');
    const refused = await json(await put('designer', revisionId, 'manual:ecc-transposed', { answer: 'not-applicable', reason: 'We think not.' }), 422);
    expect(refused.fields[0]).toEqual({ field: 'answer', message: 'This study has a single-point bonded section, so the question applies: answer yes or no (with a reason for no).' });
    const svl = await json(await put('designer', revisionId, 'manual:svl-datasheet', { answer: 'not-applicable', reason: 'n/a' }), 422);
    expect(svl.fields[0].message).toMatch(/^This study has a sheath voltage limiter \(SVL\)/);
    // The same study has no cross-bonded run: the study answers that one.
    const rows = (await detail(revisionId)).checklist;
    expect(rows.find((i: { itemKey: string }) => i.itemKey === 'manual:continuity-test')).toMatchObject({ answerGenerated: true, answer: 'not-applicable' });
    await json(await put('designer', revisionId, 'manual:ecc-transposed', { answer: 'yes' }), 200);
  });
});

describe('submitting a failing computed item', () => {
  it('needs the designer\'s justification on that item, which the checker and approver then see', async () => {
    const revisionId = await calculatedDraft('kestrel-single-point-ecc');
    const rows = (await detail(revisionId)).checklist;
    for (const m of rows.filter((i: { kind: string; answerGenerated: boolean }) => i.kind === 'manual' && !i.answerGenerated)) await json(await put('designer', revisionId, m.itemKey, { answer: 'yes' }), 200);
    const failing = rows.filter((i: { status: string }) => i.status === 'fail');
    expect(failing.length).toBeGreaterThan(0);

    const refused = await json(await step(sessions.designer, revisionId, 'submit'), 422);
    expect(refused.error).toBe('StepRefused');
    expect(refused.message).toMatch(new RegExp(`^${failing.length} failing computed items? needs? your justification before submitting`));

    const short = await json(await put('designer', revisionId, failing[0].itemKey, { justification: 'ok' }), 422);
    expect(short.fields).toEqual([{ field: 'justification', message: 'A justification needs at least a sentence.' }]);
    const passing = rows.find((i: { kind: string; status: string }) => i.kind === 'computed' && i.status === 'pass');
    const notFailing = await json(await put('designer', revisionId, passing.itemKey, { justification: 'Nothing to justify here, really.' }), 422);
    expect(notFailing.fields[0]).toEqual({ field: 'justification', message: 'Only a failing computed item needs your justification.' });

    for (const f of failing) await json(await put('designer', revisionId, f.itemKey, { justification: 'The entry is fenced and locked; the owner accepts this margin.' }), 200);
    await json(await step(sessions.designer, revisionId, 'submit'), 200);
    for (const who of ['checker', 'approver'] as const) {
      const seen = (await detail(revisionId, who)).checklist.find((i: { itemKey: string }) => i.itemKey === failing[0].itemKey);
      expect(seen.designerJustification).toBe('The entry is fenced and locked; the owner accepts this margin.');
    }
  });
});

describe('queries and remarks', () => {
  it('a query becomes a remark thread: pass is refused until the designer has answered and the checker closed it', async () => {
    const revisionId = await inCheck();
    const key = (await detail(revisionId)).checklist.find((i: { kind: string }) => i.kind === 'computed').itemKey;

    const bare = await json(await put('checker', revisionId, key, { verdict: 'query' }), 422);
    expect(bare.fields).toEqual([{ field: 'remark', message: 'Write the query: it opens a remark thread that the designer answers.' }]);
    await json(await put('checker', revisionId, key, { verdict: 'query', remark: 'Where does the 1 Ω link-box earth come from?' }), 200);
    const thread = (await detail(revisionId)).remarks.find((r: { kind: string }) => r.kind === 'query');
    expect(thread).toMatchObject({ itemKey: key, resolved: false, body: 'Where does the 1 Ω link-box earth come from?' });

    const refused = await json(await step(sessions.checker, revisionId, 'pass'), 422);
    expect(refused.message).toBe('1 checklist item is still queried: close each query once answered, or return the revision to the designer.');

    await json(await remark('designer', revisionId, { body: 'From the survey report, table 3.', parentId: thread.id }), 201);
    const designerCloses = await json(await close('designer', thread.id), 403);
    expect(designerCloses.message).toBe('The designer answers a remark with a reply; the checker (or whoever raised it) closes it.');
    const reply = (await detail(revisionId)).remarks.find((r: { parentId: string | null }) => r.parentId === thread.id);
    expect((await json(await close('checker', reply.id), 422)).fields[0].field).toBe('resolved');

    await json(await close('checker', thread.id), 200);
    const after = await detail(revisionId);
    expect(after.checklist.find((i: { itemKey: string }) => i.itemKey === key).checkerVerdict).toBe('agree');
    const closedReply = await json(await remark('designer', revisionId, { body: 'Late answer.', parentId: thread.id }), 422);
    expect(closedReply.fields[0]).toEqual({ field: 'parentId', message: 'This thread is closed: open a new remark instead.' });
    await json(await step(sessions.checker, revisionId, 'pass'), 200);
  });

  it('an open remark refuses the pass; it can stay open while the revision goes back, and must be closed on the next check', async () => {
    const revisionId = await inCheck();
    const r = await json(await remark('checker', revisionId, { body: 'State the soil resistivity source.' }), 201);
    expect((await json(await step(sessions.checker, revisionId, 'pass'), 422)).message).toBe('1 remark thread is still open: close each once answered, or return the revision to the designer.');

    await json(await step(sessions.checker, revisionId, 'return', { reason: 'See the open remark.' }), 200);
    await json(await remark('designer', revisionId, { body: 'Wenner survey, 2024 (invented for the test).', parentId: r.id }), 201);
    await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200);
    await prepareForSubmit(sessions.designer, revisionId);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
    // The remark and the reason for the return are both open threads now.
    expect((await json(await step(sessions.checker, revisionId, 'pass'), 422)).message).toMatch(/^2 remark threads are still open/);
    for (const t of (await detail(revisionId)).remarks.filter((x: { parentId: string | null; resolved: boolean }) => !x.parentId && !x.resolved)) await json(await close('checker', t.id), 200);
    await json(await step(sessions.checker, revisionId, 'pass'), 200);
  });

  it('once passed, only the approver opens remarks, and the approver cannot issue with one open', async () => {
    const revisionId = await inCheck();
    await drive(sessions, revisionId, [['checker', 'pass']]);
    const late = await json(await remark('checker', revisionId, { body: 'One more thing.' }), 409);
    expect(late.message).toBe('The revision has been passed: only the approver opens new remarks now. Reply in an open thread instead.');
    await json(await remark('designer', revisionId, { body: 'And me.' }), 409);

    const r = await json(await remark('approver', revisionId, { body: 'Confirm the fault clearance time with protection.' }), 201);
    const refused = await json(await step(sessions.approver, revisionId, 'issue'), 422);
    expect(refused).toMatchObject({ error: 'StepRefused', message: '1 remark thread is still open: close each once answered, or return the revision.' });
    await json(await remark('designer', revisionId, { body: '0.5 s, confirmed by protection.', parentId: r.id }), 201);
    expect((await json(await close('checker', r.id), 403)).error).toBe('Forbidden');
    await json(await close('approver', r.id), 200);
    await json(await step(sessions.approver, revisionId, 'issue'), 200);
  });
});

describe('check values', () => {
  it('an unexplained value outside tolerance blocks the pass until the checker corrects or deletes it; after the pass it is fixed', async () => {
    const revisionId = await inCheck();
    const target = (await detail(revisionId)).checklist.find((i: { kind: string; value: number | null }) => i.kind === 'computed' && i.value);
    const far = await json(await send(sessions.checker, 'POST', `/api/revisions/${revisionId}/check-values`, { itemKey: target.itemKey, checkerValue: target.value * 1.5 }), 201);
    expect((await json(await step(sessions.checker, revisionId, 'pass'), 422)).message).toBe('A check value is outside its tolerance without an explanation: explain it, correct it or delete it.');

    // Through a return and a resubmission the value stays, and its checker can still correct it.
    await json(await step(sessions.checker, revisionId, 'return', { reason: 'Back for a moment.' }), 200);
    expect((await json(await send(sessions.checker, 'PUT', `/api/revisions/${revisionId}/check-values/${far.id}`, { checkerValue: target.value }), 403)).message).toMatch(/only by its checker while checking/);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
    const corrected = await json(await send(sessions.checker, 'PUT', `/api/revisions/${revisionId}/check-values/${far.id}`, { checkerValue: target.value * 1.001 }), 200);
    expect(corrected.deviationPct).toBeCloseTo(0.1, 6);
    const second = await json(await send(sessions.checker, 'POST', `/api/revisions/${revisionId}/check-values`, { itemKey: target.itemKey, checkerValue: 0 }), 201);
    expect((await json(await send(sessions.designer, 'DELETE', `/api/revisions/${revisionId}/check-values/${second.id}`), 403)).error).toBe('Forbidden');
    await json(await send(sessions.checker, 'DELETE', `/api/revisions/${revisionId}/check-values/${second.id}`), 200);
    await json(await send(sessions.checker, 'DELETE', `/api/revisions/${revisionId}/check-values/${second.id}`), 404);

    for (const t of (await detail(revisionId)).remarks.filter((x: { parentId: string | null; resolved: boolean }) => !x.parentId && !x.resolved)) await json(await close('checker', t.id), 200);
    await json(await step(sessions.checker, revisionId, 'pass'), 200);
    const fixed = await json(await send(sessions.checker, 'PUT', `/api/revisions/${revisionId}/check-values/${far.id}`, { checkerValue: 1 }), 403);
    expect(fixed.message).toBe('A check value can be changed or deleted only by its checker while checking, until the revision is passed.');
    const events = await db.select({ type: auditEvents.type }).from(auditEvents).where(eq(auditEvents.revisionId, revisionId));
    expect(events.map((e) => e.type)).toEqual(expect.arrayContaining(['check-value.changed', 'check-value.deleted']));
  });
});

describe('agree with every remaining item, and withdraw', () => {
  it('agrees only with the count the checker confirmed, and leaves queries alone', async () => {
    const revisionId = await inCheck();
    const rows = (await detail(revisionId)).checklist;
    await json(await put('checker', revisionId, rows[0].itemKey, { verdict: 'query', remark: 'Why this case?' }), 200);
    const remaining = rows.length - 1;
    const stale = await json(await send(sessions.checker, 'POST', `/api/revisions/${revisionId}/checklist`, { verdict: 'agree', count: remaining + 1 }), 409);
    expect(stale.message).toBe(`The checklist changed: ${remaining} items have no verdict now, not ${remaining + 1}. Look again and confirm.`);
    expect((await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/checklist`, { verdict: 'agree', count: remaining }), 403)).error).toBe('Forbidden');
    expect(await json(await send(sessions.checker, 'POST', `/api/revisions/${revisionId}/checklist`, { verdict: 'agree', count: remaining }), 200)).toEqual({ agreed: remaining });
    const after = (await detail(revisionId)).checklist;
    expect(after.filter((i: { checkerVerdict: string }) => i.checkerVerdict === 'agree')).toHaveLength(remaining);
    expect(after[0].checkerVerdict).toBe('query');
    expect((await json(await send(sessions.checker, 'POST', `/api/revisions/${revisionId}/checklist`, { verdict: 'agree', count: 0 }), 422)).fields[0].field).toBe('count');
  });

  it('withdraw asks for a reason, which the history keeps', async () => {
    const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'G');
    const refused = await json(await step(sessions.designer, revisionId, 'withdraw'), 422);
    expect(refused.message).toBe('Say why the revision is withdrawn: the reason is kept in its history.');
    await json(await step(sessions.designer, revisionId, 'withdraw', { reason: 'The route changed: a new study follows.' }), 200);
    const [event] = await db.select().from(auditEvents).where(and(eq(auditEvents.revisionId, revisionId), eq(auditEvents.type, 'revision.withdraw')));
    expect((event.detail as { reason: string }).reason).toBe('The route changed: a new study follows.');
  });
});

describe('a remark racing the pass', () => {
  // The pass and the remark both take the revision's row lock: either the remark lands first
  // and the pass is refused, or the pass lands first and the checker's remark is refused.
  // Never a passed revision with an open remark. The delays vary which one tends to win.
  it('never leaves a passed revision with an open remark', async () => {
    const outcomes: string[] = [];
    for (const delayMs of [0, 40, 120, 300, 600, 900]) {
      const revisionId = await inCheck();
      const version = (await detail(revisionId, 'checker')).revision.version;
      const [pass, posted] = await Promise.all([
        send(sessions.checker, 'POST', `/api/revisions/${revisionId}/steps`, { step: 'pass', version, password: 'sheathwise-demo' }),
        new Promise((r) => setTimeout(r, delayMs)).then(() => remark('checker', revisionId, { body: `Raced remark after ${delayMs} ms` })),
      ]);
      const [row] = await db.select({ state: revisions.state }).from(revisions).where(eq(revisions.id, revisionId));
      const open = await db.select({ id: remarks.id }).from(remarks).where(and(eq(remarks.revisionId, revisionId), isNull(remarks.parentId), eq(remarks.resolved, false)));
      outcomes.push(`${delayMs} ms: pass ${pass.status}, remark ${posted.status}`);
      if (row.state === 'checked') {
        expect(pass.status).toBe(200);
        expect(posted.status).toBe(409);
        expect(open).toHaveLength(0);
      } else {
        expect(pass.status).toBe(422);
        expect(posted.status).toBe(201);
        expect(row.state).toBe('in_check');
      }
    }
    console.log(`[figure] remark racing pass: ${outcomes.join('; ')}`);
  });
});
