import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents, issuedRecords } from '../../src/lib/db/schema';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { caughtMail, waitForMail } from '../helpers/maildev-client';
import { type DemoRole, closeOpenThreads, demoSessions, json, readyDraft, send, step } from '../helpers/workflow-api';

// Two server processes on one database, object store and mail catcher: nothing may live in one
// process's memory. The whole story alternates between them.
let second: ChildProcess | undefined;
let otherBase = '';

beforeAll(async () => {
  const port = Number(new URL(testEnv().appUrl).port) + 13;
  otherBase = `http://127.0.0.1:${port}`;
  second = spawn(process.execPath, ['scripts/serve.mjs'], { env: { ...process.env, HOST: '127.0.0.1', PORT: String(port) }, stdio: 'ignore' });
  for (let i = 0; i < 150; i++) {
    if ((await fetch(`${otherBase}/api/health`).catch(() => null))?.status === 200) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error('the second server did not start');
});
afterAll(() => second?.kill());

describe('two servers behind one database', () => {
  it('a session from one is valid on the other; the story alternates; the record and each e-mail happen once', async () => {
    const one = await demoSessions();
    const two = Object.fromEntries(Object.entries(one).map(([role, s]) => [role, s.at(otherBase)])) as Record<DemoRole, HttpSession>;
    const { revisionId } = await readyDraft(one.designer, 'fernhollow-cross-bonded', 'S');
    await json(await two.designer.fetch(`/api/revisions/${revisionId}`), 200);

    const stepOn = async (s: HttpSession, name: string) => json(await step(s, revisionId, name), 200);
    await stepOn(two.designer, 'submit');
    await stepOn(one.checker, 'startCheck');
    await json(await send(two.checker, 'POST', `/api/revisions/${revisionId}/remarks`, { body: 'Seen from the second server.' }), 201);
    await closeOpenThreads(one.checker, revisionId);
    await stepOn(two.checker, 'pass');
    await stepOn(one.approver, 'issue');

    const record = async (s: HttpSession) => {
      for (let i = 0; i < 100; i++) {
        const res = await s.fetch(`/api/revisions/${revisionId}/record`);
        if (res.status === 200) return res.headers.get('x-record-sha256');
        await new Promise((r) => setTimeout(r, 300));
      }
      throw new Error('the issued record was not rendered');
    };
    expect(await record(two.auditor)).toBe(await record(one.auditor));

    // Both servers run workers on the same queues: every job is taken by exactly one of them.
    // Every message links to the revision, so its id picks out this story's mail.
    await waitForMail(testEnv().mailWebUrl, (m) => m.some((x) => x.text.includes(revisionId) && x.subject.includes('issued')));
    await new Promise((r) => setTimeout(r, 2000)); // room for a duplicate to show up
    const mine = (await caughtMail(testEnv().mailWebUrl)).filter((m) => m.text.includes(revisionId));
    const keys = mine.map((m) => `${m.to.map((t) => t.address).join(',')}|${m.subject}|${m.text.length}`);
    expect(new Set(keys).size).toBe(keys.length);
    expect(mine.some((m) => m.subject.includes('ready for your check'))).toBe(true);

    const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
    try {
      expect(await db.select().from(issuedRecords).where(eq(issuedRecords.revisionId, revisionId))).toHaveLength(1);
      expect(await db.select().from(auditEvents).where(and(eq(auditEvents.revisionId, revisionId), eq(auditEvents.type, 'record.issued')))).toHaveLength(1);
    } finally {
      await pool.end();
    }
  });
});
