import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { sql } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { snapshotCache, snapshotStamp } from '../../src/lib/db/snapshot-cache';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { fillDesignerQueue } from '../helpers/queue-drafts';
import { demoSessions, json, readyDraft } from '../helpers/workflow-api';

// Answers kept under the database's snapshot (the home page queues, the audit trail) must never
// outlive a write, whoever made it: these tests write behind the server's back, with plain SQL,
// and expect the next answer to show it.

const { db, pool } = createDatabase(testEnv().databaseUrl, 2);
let sessions: Record<'designer' | 'auditor', HttpSession>;

beforeAll(async () => {
  sessions = await demoSessions();
  await fillDesignerQueue(sessions.designer, db);
}, 120_000);
afterAll(() => pool.end());

/** A connection of its own, to hold a transaction open while others read. */
async function writer() {
  const client = new pg.Client({ connectionString: testEnv().databaseUrl });
  await client.connect();
  return client;
}

/** Tries `attempt` a few times: the server's own jobs may write at any moment, so "nothing changed" is shown once, not every time. */
async function someTime(attempt: () => Promise<boolean>, tries = 20): Promise<boolean> {
  for (let i = 0; i < tries; i++) if (await attempt()) return true;
  return false;
}

describe('snapshot stamp', () => {
  it('stands while only reads run', async () => {
    expect(
      await someTime(async () => {
        const before = await snapshotStamp(db);
        await db.execute(sql`select count(*) from revisions`);
        await db.execute(sql`select * from audit_events order by id desc limit 20`);
        return (await snapshotStamp(db)) === before;
      }),
    ).toBe(true);
  });

  it('moves when a writer commits, and when one gives up', async () => {
    const client = await writer();
    try {
      for (const end of ['commit', 'rollback']) {
        await client.query('begin');
        await client.query(`update projects set name = name where id = (select id from projects order by id limit 1)`);
        // Until it ends, the writer's row is invisible to everyone else, whatever the stamp says.
        const during = await snapshotStamp(db);
        await client.query(end);
        expect(await snapshotStamp(db)).not.toBe(during);
      }
    } finally {
      await client.end();
    }
  });

  it('keeps an answer while the stamp stands, shares it between callers, and computes afresh after a write', async () => {
    const cached = snapshotCache<{ n: number }>(1_000);
    let computed = 0;
    const compute = async () => ({ n: ++computed });
    // Unchanged database: the second call is answered from the first.
    expect(
      await someTime(async () => {
        const first = await cached(db, 'k', compute);
        return (await cached(db, 'k', compute)) === first;
      }),
    ).toBe(true);
    // Two callers at once, one computation.
    const was = computed;
    expect(await someTime(async () => {
      const [a, b] = await Promise.all([cached(db, 'shared', compute), cached(db, 'shared', compute)]);
      return a === b;
    })).toBe(true);
    expect(computed).toBeGreaterThan(was);
    // A committed write, and the next call computes again.
    const before = await cached(db, 'k', compute);
    await db.execute(sql`update projects set name = name where id = (select id from projects order by id limit 1)`);
    expect((await cached(db, 'k', compute)).n).toBeGreaterThan(before.n);
  });

  it('does not keep an answer larger, as JSON, than the whole cache', async () => {
    const cached = snapshotCache<{ n: number; text: string }>(100);
    let computed = 0;
    const big = async () => ({ n: ++computed, text: 'x'.repeat(200) });
    expect(
      await someTime(async () => {
        const before = await snapshotStamp(db);
        await cached(db, 'big', big);
        await new Promise((settled) => setImmediate(settled));
        const was = computed;
        await cached(db, 'big', big);
        return (await snapshotStamp(db)) === before && computed === was + 1;
      }),
    ).toBe(true);
  });
});

describe('answers kept under the snapshot', () => {
  it('the home page queue shows a study renamed behind the server, even when the rename was still uncommitted as the queue was read', async () => {
    const first = await json(await sessions.designer.fetch('/api/me/queue'), 200);
    const item = first.waiting.find((w: { role: string }) => w.role === 'designer').items[0];
    const title = (q: { waiting: Array<{ role: string; items: Array<{ revisionId: string; studyTitle: string }> }> }) =>
      q.waiting.find((w) => w.role === 'designer')?.items.find((i) => i.revisionId === item.revisionId)?.studyTitle;
    const client = await writer();
    try {
      await client.query('begin');
      await client.query(`update studies set title = title || ' (renamed)' where id = (select study_id from revisions where id = $1)`, [item.revisionId]);
      // Read while the rename is in flight: the old title, kept under a snapshot that names the writer.
      expect(title(await json(await sessions.designer.fetch('/api/me/queue'), 200))).toBe(item.studyTitle);
      await client.query('commit');
      expect(title(await json(await sessions.designer.fetch('/api/me/queue'), 200))).toBe(`${item.studyTitle} (renamed)`);
    } finally {
      await client.query(`update studies set title = $2 where id = (select study_id from revisions where id = $1)`, [item.revisionId, item.studyTitle]);
      await client.end();
    }
  });

  it('the audit trail and the revision history show a study code changed behind the server on the next page they serve', async () => {
    const { studyId, revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'S');
    type Told = { events: Array<{ studyCode: string }> };
    const codes = async (path: string) => [...new Set(((await json(await sessions.auditor.fetch(path), 200)) as Told).events.map((e) => e.studyCode))];
    const trail = `/api/audit?revisionId=${revisionId}&pageSize=20`;
    const history = `/api/revisions/${revisionId}/history`;
    const [code] = await codes(trail);
    expect(await codes(history)).toEqual([code]);
    await db.execute(sql`update studies set code = ${`${code}X`} where id = ${studyId}`);
    expect(await codes(trail)).toEqual([`${code}X`]);
    expect(await codes(history)).toEqual([`${code}X`]);
  });

  it('the audit filters name a person renamed behind the server', async () => {
    const people = async () => (await json(await sessions.auditor.fetch('/api/audit/facets'), 200)).people as Array<{ id: string; name: string }>;
    const [person] = await people();
    try {
      await db.execute(sql`update users set name = ${`${person.name} (renamed)`} where id = ${person.id}`);
      expect((await people()).find((p) => p.id === person.id)?.name).toBe(`${person.name} (renamed)`);
    } finally {
      await db.execute(sql`update users set name = ${person.name} where id = ${person.id}`);
    }
  });
});
