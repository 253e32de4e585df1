import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase } from '../../src/lib/db/client';
import { QUEUE_PAGE, queuePage } from '../../src/lib/studies/queue.service';
import { sql } from 'drizzle-orm';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { designerWaiting, fillDesignerQueue } from '../helpers/queue-drafts';
import { DEMO, demoSessions, json } from '../helpers/workflow-api';

// The home page's queues at any length: a page of the longest waiting, the total, and the next
// page by position. The list the pages make is exactly the queue, in order, each once.

const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
let designer: HttpSession;
let auditor: HttpSession;

beforeAll(async () => {
  ({ designer, auditor } = await demoSessions());
  await fillDesignerQueue(designer, db);
}, 120_000);
afterAll(() => pool.end());

interface Item { revisionId: string; updatedAt: string; state: string }
interface Page { role: string; items: Item[]; total: number; totalAtLeast: boolean; next: string | null }

describe('my queue', () => {
  it('gives the first page of each queue with its total, and the pages after it walk the whole queue once, longest waiting first', async () => {
    const first = await json(await designer.fetch('/api/me/queue'), 200);
    const mine: Page = first.waiting.find((w: Page) => w.role === 'designer');
    const total = await designerWaiting(db);
    expect(mine.total).toBe(total);
    expect(mine.totalAtLeast).toBe(false);
    expect(mine.items).toHaveLength(QUEUE_PAGE);
    expect(mine.next).toEqual(expect.any(String));

    const all = [...mine.items];
    for (let after = mine.next; after; ) {
      const page: Page = await json(await designer.fetch(`/api/me/queue?${new URLSearchParams({ role: 'designer', after })}`), 200);
      expect(page.total).toBe(total);
      expect(page.items.length).toBeLessThanOrEqual(QUEUE_PAGE);
      all.push(...page.items);
      after = page.next;
    }
    expect(all).toHaveLength(total);
    expect(new Set(all.map((i) => i.revisionId)).size).toBe(total);
    expect(all.every((i) => i.state === 'draft' || i.state === 'returned')).toBe(true);
    const times = all.map((i) => Date.parse(i.updatedAt));
    expect(times).toEqual([...times].sort((a, b) => a - b));
  });

  it('refuses a position it did not give out, one without its queue, an unknown queue or parameter, each by name', async () => {
    const refused = async (query: string) => (await json(await designer.fetch(`/api/me/queue?${query}`), 422)).fields.map((f: { field: string }) => f.field);
    expect(await refused('role=designer&after=bm90LWEtcG9zaXRpb24')).toEqual(['after']);
    const { next } = (await json(await designer.fetch('/api/me/queue'), 200)).waiting.find((w: Page) => w.role === 'designer');
    // A position of the designer's queue is not one of the checker's.
    expect(await refused(`role=checker&after=${next}`)).toEqual(['after']);
    expect(await refused(`after=${next}`)).toEqual(['role']);
    expect(await refused('role=manager')).toEqual(['role']);
    expect(await refused('page=2')).toEqual(['page']);
  });

  it('counts a long queue only up to a limit, and says it holds at least that many', async () => {
    const { rows } = await db.execute<{ id: string; email: string; name: string; project: string; role: 'designer' }>(
      sql`select u.id, u.email, u.name, m.project_id as project, m.role from users u join memberships m on m.user_id = u.id where u.email = ${DEMO.designer}`,
    );
    const projectRoles: Record<string, Array<(typeof rows)[number]['role']>> = {};
    for (const r of rows) (projectRoles[r.project] ??= []).push(r.role);
    const user = { id: rows[0].id, email: rows[0].email, name: rows[0].name, isAdmin: false, projectRoles };
    const total = await designerWaiting(db);
    expect(await queuePage(db, user, 'designer', undefined, total)).toMatchObject({ total, totalAtLeast: false });
    const capped = await queuePage(db, user, 'designer', undefined, total - 1);
    expect(capped).toMatchObject({ total: total - 1, totalAtLeast: true });
    expect(capped.items).toHaveLength(QUEUE_PAGE);
  });

  it('has no queue for a role the person does not hold: an empty page, not an error', async () => {
    expect((await json(await auditor.fetch('/api/me/queue'), 200)).waiting).toEqual([]);
    expect(await json(await auditor.fetch('/api/me/queue?role=designer'), 200)).toMatchObject({ items: [], total: 0, next: null });
  });
});
