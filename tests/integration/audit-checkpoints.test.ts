import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { asc, desc, eq, sql } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditCheckpoints, auditEvents } from '../../src/lib/db/schema';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoSessions, json, readyDraft } from '../helpers/workflow-api';

// Verification in full (from the first event) or incremental (from the last checkpoint).
let sessions: Record<DemoRole, HttpSession>;
const { db, pool } = createDatabase(testEnv().databaseUrl, 1);

beforeAll(async () => {
  sessions = await demoSessions();
});
afterAll(() => pool.end());

const verify = async (mode?: string) => json(await sessions.admin.fetch(`/api/audit/verify${mode ? `?mode=${mode}` : ''}`), 200);
const lastEventId = async () => (await db.select({ id: auditEvents.id }).from(auditEvents).orderBy(desc(auditEvents.id)).limit(1))[0].id;

/** Changes one event's detail for the duration of `check`, then puts it back. */
async function tampered<T>(id: number, check: () => Promise<T>): Promise<T> {
  const [victim] = await db.select().from(auditEvents).where(eq(auditEvents.id, id));
  await db.update(auditEvents).set({ detail: sql`${auditEvents.detail} || '{"tampered": true}'::jsonb` }).where(eq(auditEvents.id, id));
  try {
    return await check();
  } finally {
    await db.update(auditEvents).set({ detail: victim.detail }).where(eq(auditEvents.id, id));
  }
}

describe('audit verification with checkpoints', () => {
  it('leaves a checkpoint after a full verification and continues from it', async () => {
    const full = await verify('full');
    const upTo = await lastEventId();
    expect(full).toMatchObject({ ok: true, mode: 'full', verifiedAfterId: 0 });
    expect(full.verifiedUpToId).toBeGreaterThanOrEqual(upTo);
    const [checkpoint] = await db.select().from(auditCheckpoints).orderBy(desc(auditCheckpoints.id)).limit(1);
    expect(checkpoint).toMatchObject({ eventId: full.verifiedUpToId, mode: 'full' });

    await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'V'); // new events after the checkpoint
    const newest = await lastEventId();
    const incremental = await verify('incremental');
    expect(incremental).toMatchObject({ ok: true, mode: 'incremental' });
    expect(incremental.verifiedAfterId).toBeGreaterThanOrEqual(full.verifiedUpToId);
    expect(incremental.verifiedUpToId).toBeGreaterThanOrEqual(newest);
    // Only the events since the checkpoint were read (the admin sees every event).
    expect(incremental.checked).toBe(Number((await db.execute(sql`select count(*) as n from audit_events where id > ${incremental.verifiedAfterId} and id <= ${incremental.verifiedUpToId}`)).rows[0].n));
    expect(incremental.checked).toBeLessThan(full.checked);
  });

  it('a change before the checkpoint is left to the full verification, which finds it', async () => {
    await verify('full');
    const [first] = await db.select({ id: auditEvents.id }).from(auditEvents).orderBy(asc(auditEvents.id)).limit(1);
    await tampered(first.id, async () => {
      expect(await verify('incremental')).toMatchObject({ ok: true });
      expect(await verify('full')).toMatchObject({ ok: false, firstBroken: { id: first.id, reason: expect.stringContaining('changed') } });
    });
    expect(await verify('full')).toMatchObject({ ok: true });
  });

  it('a change to the checkpoint\'s own event is found by the incremental verification', async () => {
    const { verifiedUpToId } = await verify('full');
    await tampered(verifiedUpToId, async () => {
      const report = await verify('incremental');
      expect(report).toMatchObject({ ok: false, firstBroken: { id: verifiedUpToId, reason: expect.stringContaining('checkpoint') } });
    });
    expect(await verify('incremental')).toMatchObject({ ok: true });
  });

  it('names the mode field when it is not one it knows', async () => {
    const res = await sessions.admin.fetch('/api/audit/verify?mode=sometimes');
    expect(res.status).toBe(422);
    expect((await res.json()).fields[0].field).toBe('mode');
  });
});
