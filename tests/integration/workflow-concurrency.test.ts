import { describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents } from '../../src/lib/db/schema';
import { testEnv } from '../helpers/env';
import { currentVersion, demoSessions, drive, readyDraft, send } from '../helpers/workflow-api';

describe('concurrent attempts on one revision', () => {
  it('20 simultaneous passes: exactly one succeeds, the rest get 409, one audit event', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
    const version = await currentVersion(sessions.checker, revisionId);

    const responses = await Promise.all(
      Array.from({ length: 20 }, () => send(sessions.checker, 'POST', `/api/revisions/${revisionId}/steps`, { step: 'pass', version })),
    );
    const statuses = responses.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(19);

    const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
    try {
      const events = await db.select().from(auditEvents).where(and(eq(auditEvents.revisionId, revisionId), eq(auditEvents.type, 'revision.pass')));
      expect(events).toHaveLength(1);
    } finally {
      await pool.end();
    }
  });
});
