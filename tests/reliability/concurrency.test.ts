import { describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents, remarks } from '../../src/lib/db/schema';
import { DEMO_PASSWORD, testEnv } from '../helpers/env';
import { currentVersion, demoSessions, drive, readyDraft, send } from '../helpers/workflow-api';
import { figure, percentile, timed } from './figures';
import { type CaughtMail, waitForMail } from '../helpers/maildev-client';

// More requests at once than the server's pool has connections (10): before every query in a
// transaction used the transaction's handle, about a dozen of these froze the whole server.
const WAYS = 50;

describe('50-way concurrency on one revision', () => {
  it('50 simultaneous remarks all land, and the health probe answers meanwhile', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'C');
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);

    const health = timed(() => fetch(`${testEnv().appUrl}/api/health`));
    const posts = await Promise.all(
      Array.from({ length: WAYS }, (_, i) => timed(() => send(sessions.checker, 'POST', `/api/revisions/${revisionId}/remarks`, { body: `Concurrent remark ${i}` }))),
    );
    const probe = await health;
    const ms = posts.map((p) => p.ms);
    figure('50 concurrent remark posts: p50', percentile(ms, 50).toFixed(0), 'ms');
    figure('50 concurrent remark posts: max', Math.max(...ms).toFixed(0), 'ms');
    figure('health during the burst', probe.ms.toFixed(0), 'ms');

    expect(posts.map((p) => p.status)).toEqual(Array(WAYS).fill(201));
    expect(probe.status).toBe(200);

    const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
    try {
      const stored = await db.select({ id: remarks.id }).from(remarks).where(eq(remarks.revisionId, revisionId));
      expect(stored).toHaveLength(WAYS);
    } finally {
      await pool.end();
    }

    // Each remark e-mails the designer. The queue takes five jobs a fetch; waiting the polling
    // interval (2 s) between full fetches drained this burst in 20 s or more, so mail from other
    // work waited behind it. A full fetch now fetches again at once.
    const t0 = Date.now();
    const mine = (mail: CaughtMail[]) => mail.filter((m) => m.to.some((t) => t.address === 'designer@sheathwise.example') && /Concurrent remark \d+/.test(m.text));
    await waitForMail(testEnv().mailWebUrl, (mail) => mine(mail).length >= WAYS, 60_000);
    const drainMs = Date.now() - t0;
    figure('50 remark e-mails caught after the burst', drainMs.toFixed(0), 'ms');
    expect(drainMs).toBeLessThan(15_000);
  });

  it('50 simultaneous passes: one succeeds, 49 get 409, one audit event, and the server still answers', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'C');
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
    const version = await currentVersion(sessions.checker, revisionId);

    const steps = await Promise.all(
      Array.from({ length: WAYS }, () => timed(() => send(sessions.checker, 'POST', `/api/revisions/${revisionId}/steps`, { step: 'pass', version, password: DEMO_PASSWORD }))),
    );
    figure('50 concurrent steps: max', Math.max(...steps.map((s) => s.ms)).toFixed(0), 'ms');
    const statuses = steps.map((s) => s.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(WAYS - 1);

    const after = await fetch(`${testEnv().appUrl}/api/health`);
    expect(after.status).toBe(200);

    const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
    try {
      const events = await db.select().from(auditEvents).where(and(eq(auditEvents.revisionId, revisionId), eq(auditEvents.type, 'revision.pass')));
      expect(events).toHaveLength(1);
    } finally {
      await pool.end();
    }
  });
});
