import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq, inArray } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { assetObligations, digestSends, reminderSends } from '../../src/lib/db/schema';
import { JobQueue } from '../../src/lib/jobs/job-queue';
import { MAIL_QUEUE } from '../../src/lib/mail/mail-delivery';
import { sendDueReminders, sendWeeklyDigests } from '../../src/lib/register/reminders.service';
import { addMonths, weekStartOn } from '../../src/lib/register/due-dates';
import type { AppServices } from '../../src/lib/services';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { caughtMail, waitForMail } from '../helpers/maildev-client';
import { type DemoRole, demoIds, demoSessions, json, send, uploadForm } from '../helpers/workflow-api';
import { daysFromToday, newAsset, ownStandard, tag, todayUtc } from './register.fixture';

// Reminders go out once per stage (within the window before the due date, then overdue), never
// twice: not when two server processes run the daily job at the same moment, nor after a
// restart. The key of reminder_sends decides; these tests only count what reached the catcher.

const { mailWebUrl, databaseUrl, appUrl } = testEnv();
let second: ChildProcess | undefined;
let otherBase = '';
let sessions: Record<DemoRole, HttpSession>;

async function startSecond() {
  second = spawn(process.execPath, ['scripts/serve.mjs'], { env: { ...process.env, HOST: '127.0.0.1', PORT: String(new URL(otherBase).port) }, stdio: 'ignore' });
  for (let i = 0; i < 150; i++) {
    if ((await fetch(`${otherBase}/api/health`).catch(() => null))?.status === 200) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error('the second server did not start');
}

async function stopSecond() {
  if (!second || second.exitCode !== null) return;
  const exited = new Promise((r) => second!.once('exit', r));
  second.kill();
  await exited;
}

beforeAll(async () => {
  otherBase = `http://127.0.0.1:${Number(new URL(appUrl).port) + 17}`;
  sessions = await demoSessions();
  await startSecond();
}, 60_000);
afterAll(stopSecond);

const mailAbout = async (code: string) => (await caughtMail(mailWebUrl)).filter((m) => m.subject.includes(code));

/** In-process services on their own pool and queue: a third "process" for the service-level runs. */
async function processServices(): Promise<AppServices & { close(): Promise<void> }> {
  const { db, pool } = createDatabase(databaseUrl, 3);
  const jobs = await JobQueue.start(databaseUrl, [MAIL_QUEUE]);
  return { db, pool, jobs, store: null, appUrl, close: async () => { await jobs.stop(); await pool.end(); } };
}

describe('reminders and digests', () => {
  it('sends the due-soon reminder once when both servers run the daily job together, and not again after a restart', async () => {
    const { projectId } = await demoIds(sessions.designer);
    const std = await ownStandard(sessions.admin);
    const code = `RM${tag()}`;
    // In service in 10 days: the oversheath test after installation falls due then (first due 0 months).
    await newAsset(sessions.designer, projectId, { kind: 'circuit', code, name: 'Reminder circuit (invented)', ownerStandard: std.ownerStandard, inServiceOn: daysFromToday(10) });

    const adminTwo = sessions.admin.at(otherBase);
    const runs = await Promise.all([send(sessions.admin, 'POST', '/api/register/reminders'), send(adminTwo, 'POST', '/api/register/reminders'), send(sessions.admin, 'POST', '/api/register/reminders')]);
    for (const r of runs) await json(r, 200);
    // Two responsible people (the demo designer and approver) each get it once.
    await waitForMail(mailWebUrl, (m) => m.filter((x) => x.subject.includes(code)).length >= 2);
    await stopSecond();
    await startSecond();
    await json(await send(sessions.admin.at(otherBase), 'POST', '/api/register/reminders'), 200);
    await json(await send(sessions.admin, 'POST', '/api/register/reminders'), 200);
    await new Promise((r) => setTimeout(r, 2500)); // room for a duplicate to arrive
    const mine = await mailAbout(code);
    expect(mine.map((m) => m.to[0].address).sort()).toEqual(['approver@sheathwise.example', 'designer@sheathwise.example']);
    expect(mine.every((m) => m.subject.includes(`Oversheath test at ${code} is due on ${daysFromToday(10)}`))).toBe(true);
    expect(mine[0].text).toContain('UTC date');
  }, 120_000);

  it('sends the overdue stage once more when the due date passes, across concurrent runs and a restart', async () => {
    const { projectId } = await demoIds(sessions.designer);
    const std = await ownStandard(sessions.admin);
    const code = `RO${tag()}`;
    const asset = await newAsset(sessions.designer, projectId, { kind: 'circuit', code, name: 'Overdue circuit (invented)', ownerStandard: std.ownerStandard, inServiceOn: daysFromToday(5) });
    const due = daysFromToday(5);
    const [one, two] = await Promise.all([processServices(), processServices()]);
    try {
      // Today: within the window. Then the day after the due date, twice at once.
      expect(await sendDueReminders(one, todayUtc())).toBeGreaterThanOrEqual(0);
      const later = daysFromToday(6);
      const counts = await Promise.all([sendDueReminders(one, later), sendDueReminders(two, later)]);
      const sends = await one.db.select().from(reminderSends).where(eq(reminderSends.assetId, asset.id));
      expect(sends.map((r) => `${r.stage}@${r.dueOn}`).sort()).toEqual([`due-soon@${due}`, `overdue@${due}`]);
      expect(counts.reduce((a, b) => a + b, 0)).toBeGreaterThanOrEqual(1);
    } finally {
      await one.close();
      await two.close();
    }
    const restarted = await processServices();
    try {
      await sendDueReminders(restarted, daysFromToday(7));
    } finally {
      await restarted.close();
    }
    await waitForMail(mailWebUrl, (m) => m.filter((x) => x.subject.includes(`${code} is overdue since ${due}`)).length >= 2);
    await new Promise((r) => setTimeout(r, 2500));
    const mine = await mailAbout(code);
    expect(mine.filter((m) => m.subject.includes('overdue')).length).toBe(2);
    expect(mine.filter((m) => m.subject.includes('is due on')).length).toBe(2);
  }, 120_000);

  it('moves the next due date with each record: a pass restarts the interval, a fail keeps it due', async () => {
    const { projectId } = await demoIds(sessions.designer);
    const std = await ownStandard(sessions.admin, { intervalMonths: 24 });
    const asset = await newAsset(sessions.designer, projectId, { kind: 'circuit', code: `RD${tag()}`, name: 'Due-date circuit (invented)', ownerStandard: std.ownerStandard, inServiceOn: '2024-02-29' });
    const detail = async () => (await json(await sessions.designer.fetch(`/api/assets/${asset.id}`), 200)).obligations.find((o: { type: { id: string } }) => o.type.id === std.oversheathId);
    expect((await detail()).nextDueOn).toBe('2024-02-29');

    const record = (fields: Record<string, string>, file?: [string, string]) => {
      const form = file ? uploadForm('other', file[0], file[1]) : new FormData();
      form.delete('kind');
      for (const [k, v] of Object.entries({ obligationTypeId: std.oversheathId, performedBy: 'Test contractor (invented)', ...fields })) form.set(k, v);
      return send(sessions.designer, 'POST', `/api/assets/${asset.id}/records`, form);
    };
    const passed = await json(await record({ doneOn: '2024-02-29', values: '5.2, 7.9, 12' }, ['ir-readings.csv', 'phase,MOhm\nA,5.2\nB,7.9\nC,12\n']), 201);
    expect(passed.result).toBe('pass');
    expect(passed.hasEvidence).toBe(true);
    // Leap day + 24 months is 28 February (month-end rule, common practice).
    expect((await detail()).nextDueOn).toBe(addMonths('2024-02-29', 24));
    expect((await detail()).nextDueOn).toBe('2026-02-28');
    const evidence = await sessions.auditor.fetch(`/api/assets/${asset.id}/records/${passed.id}/evidence`);
    expect(evidence.status).toBe(200);
    expect(await evidence.text()).toContain('A,5.2');

    const failed = await json(await record({ doneOn: '2025-06-01', values: '0.4, 8' }), 201);
    expect(failed.result).toBe('fail');
    expect((await detail()).nextDueOn).toBe('2025-06-01');

    const bad = await json(await record({ doneOn: '2025-02-29', values: 'high', performedBy: '' }), 422);
    expect(bad.fields.map((f: { field: string }) => f.field).sort()).toEqual(['doneOn', 'performedBy', 'values']);
    const noValues = await json(await record({ doneOn: '2025-06-02', values: '' }), 422);
    expect(noValues.fields[0].field).toBe('values');
    const { db, pool } = createDatabase(databaseUrl, 1);
    try {
      const [row] = await db.select().from(assetObligations).where(and(eq(assetObligations.assetId, asset.id), inArray(assetObligations.obligationTypeId, [std.oversheathId])));
      expect(row.lastResult).toBe('fail');
    } finally {
      await pool.end();
    }
  });

  it('sends one weekly digest per person and week', async () => {
    const s = await processServices();
    const monday = weekStartOn(todayUtc());
    try {
      const first = await sendWeeklyDigests(s, todayUtc());
      const again = await Promise.all([sendWeeklyDigests(s, todayUtc()), sendWeeklyDigests(s, monday)]);
      expect(again).toEqual([0, 0]);
      const rows = await s.db.select().from(digestSends).where(eq(digestSends.weekStartOn, monday));
      expect(rows.length).toBeGreaterThanOrEqual(first);
      expect(rows.length).toBeGreaterThan(0);
    } finally {
      await s.close();
    }
    const mail = await waitForMail(mailWebUrl, (m) => m.some((x) => x.to[0].address === 'designer@sheathwise.example' && x.subject === `[Sheathwise] Register digest for the week of ${monday}`));
    expect(mail.filter((x) => x.to[0].address === 'designer@sheathwise.example' && x.subject.includes(`week of ${monday}`))).toHaveLength(1);
  });
});
