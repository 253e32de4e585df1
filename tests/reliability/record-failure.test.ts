import { spawn, type ChildProcess } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents, issuedRecords, recordFailures, revisions } from '../../src/lib/db/schema';
import { storeIssuedRecord } from '../../src/lib/records/records.service';
import { testEnv } from '../helpers/env';
import { demoSessions, drive, json, readyDraft, send } from '../helpers/workflow-api';

async function until<T>(probe: () => Promise<T | undefined>, seconds: number): Promise<T> {
  const end = Date.now() + seconds * 1000;
  for (;;) {
    const value = await probe();
    if (value !== undefined) return value;
    if (Date.now() > end) throw new Error(`not within ${seconds} s`);
    await new Promise((r) => setTimeout(r, 300));
  }
}

describe('an issued record that cannot be rendered', () => {
  it('is marked failed once (no endless retries), says why on download, and renders after a retry by an approver', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    const { db, pool } = createDatabase(testEnv().databaseUrl, 2);
    try {
      await until(async () => (await db.select().from(issuedRecords).where(eq(issuedRecords.revisionId, revisionId)))[0], 30);
      // A fault the renderer cannot get past: the stored results lose their cases.
      const [revision] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
      await db.delete(issuedRecords).where(eq(issuedRecords.revisionId, revisionId));
      await db.update(revisions).set({ results: { kind: 'bonding' } }).where(eq(revisions.id, revisionId));

      await storeIssuedRecord({ db, pool }, revisionId);
      await storeIssuedRecord({ db, pool }, revisionId); // a retried job: no second failure event
      const failures = await db.select().from(recordFailures).where(eq(recordFailures.revisionId, revisionId));
      expect(failures).toHaveLength(1);
      const failedEvents = await db.select().from(auditEvents).where(eq(auditEvents.revisionId, revisionId));
      expect(failedEvents.filter((e) => e.type === 'record.failed')).toHaveLength(1);

      const refused = await json(await sessions.auditor.fetch(`/api/revisions/${revisionId}/record`), 409);
      expect(refused.error).toBe('RecordFailed');
      expect(refused.message).toContain('could not be rendered');

      // Only an approver may ask again; then, with the cause fixed, the server's job renders it.
      expect((await send(sessions.checker, 'POST', `/api/revisions/${revisionId}/record`)).status).toBe(403);
      await db.update(revisions).set({ results: revision.results }).where(eq(revisions.id, revisionId));
      await json(await send(sessions.approver, 'POST', `/api/revisions/${revisionId}/record`), 202);
      const res = await until(async () => {
        const r = await sessions.auditor.fetch(`/api/revisions/${revisionId}/record`);
        return r.status === 200 ? r : undefined;
      }, 30);
      expect(res.headers.get('x-record-draft')).toBe('false');
      expect(await db.select().from(recordFailures).where(eq(recordFailures.revisionId, revisionId))).toHaveLength(0);
    } finally {
      await pool.end();
    }
  });

  it('a record left unrendered by a crash is rendered by the next server to start, once', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    const { db, pool } = createDatabase(testEnv().databaseUrl, 2);
    const port = Number(new URL(testEnv().appUrl).port) + 9;
    let server: ChildProcess | undefined;
    try {
      await until(async () => (await db.select().from(issuedRecords).where(eq(issuedRecords.revisionId, revisionId)))[0], 30);
      // As if the server had died after the issue committed and before the record was stored.
      await db.delete(issuedRecords).where(eq(issuedRecords.revisionId, revisionId));
      server = spawn(process.execPath, ['scripts/serve.mjs'], { env: { ...process.env, HOST: '127.0.0.1', PORT: String(port) }, stdio: 'ignore' });
      // The workers start with the first request.
      await until(async () => ((await fetch(`http://127.0.0.1:${port}/api/health`).catch(() => null))?.status === 200 ? true : undefined), 30);
      const t0 = Date.now();
      await until(async () => (await db.select().from(issuedRecords).where(eq(issuedRecords.revisionId, revisionId)))[0], 60);
      console.log(`[figure] unrendered record stored by the restarted server after ${Date.now() - t0} ms`);
      const events = await db.select().from(auditEvents).where(eq(auditEvents.revisionId, revisionId));
      expect(events.filter((e) => e.type === 'record.issued').length).toBeGreaterThanOrEqual(1);
    } finally {
      server?.kill();
      await pool.end();
    }
  });
});

