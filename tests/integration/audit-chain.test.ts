import { describe, expect, it } from 'vitest';
import { desc, eq, sql } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents } from '../../src/lib/db/schema';
import { testEnv } from '../helpers/env';
import { demoSessions, drive, json, readyDraft } from '../helpers/workflow-api';

describe('audit trail', () => {
  it('records every step, lists and filters it, exports CSV, and verifies the chain', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'return']]);
    const page = await json(await sessions.auditor.fetch(`/api/audit?revisionId=${revisionId}&pageSize=50`), 200);
    const types = page.events.map((e: { type: string }) => e.type).reverse();
    expect(types.slice(-3)).toEqual(['revision.submit', 'revision.startCheck', 'revision.return']);
    expect(types).toContain('revision.calculated');
    expect(page.events.find((e: { type: string }) => e.type === 'revision.return').detail).toMatchObject({ state: { from: 'in_check', to: 'returned' }, reason: 'Please look again.' });

    const csv = await sessions.auditor.fetch(`/api/audit/export?revisionId=${revisionId}`);
    expect(csv.headers.get('content-type')).toContain('text/csv');
    const lines = (await csv.text()).trim().split('\r\n');
    expect(lines[0]).toBe('id,at,actor_id,actor_name,type,event,project_id,project_code,project_name,study_id,study_code,revision_id,revision_number,detail,prev_hash,hash');
    expect(lines).toHaveLength(page.total + 1);

    const bad = await sessions.auditor.fetch('/api/audit?from=yesterday');
    expect(bad.status).toBe(422);
    expect((await bad.json()).fields[0].field).toBe('from');

    expect(await json(await sessions.auditor.fetch('/api/audit/verify'), 200)).toMatchObject({ ok: true });
  });

  it('reports a tampered row as the first broken link', async () => {
    const sessions = await demoSessions();
    const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
    const [victim] = await db.select().from(auditEvents).orderBy(desc(auditEvents.id)).offset(3).limit(1);
    try {
      await db.update(auditEvents).set({ detail: sql`${auditEvents.detail} || '{"tampered": true}'::jsonb` }).where(eq(auditEvents.id, victim.id));
      const report = await json(await sessions.auditor.fetch('/api/audit/verify'), 200);
      expect(report.ok).toBe(false);
      expect(report.firstBroken.id).toBe(victim.id);
      expect(report.firstBroken.reason).toContain('changed');
    } finally {
      await db.update(auditEvents).set({ detail: victim.detail }).where(eq(auditEvents.id, victim.id));
      await pool.end();
    }
    expect(await json(await sessions.auditor.fetch('/api/audit/verify'), 200)).toMatchObject({ ok: true });
  });
});
