import { beforeAll, describe, expect, it } from 'vitest';
import type { HttpSession } from '../helpers/http-session';
import { demoIds, demoSessions, fixtureInputs, json, send } from '../helpers/workflow-api';

// The project studies list pages by position (keyset): walking it page by page must give every
// study once, in the order asked for, whatever the sort; a made-up position is refused by field.

const COUNT = 23;
const PAGE = 5;
let designer: HttpSession;
let projectId: string;
let prefix: string;
/** The studies made here, in the order they were made. */
const made: Array<{ id: string; code: string; title: string }> = [];

beforeAll(async () => {
  ({ designer } = await demoSessions());
  const ids = await demoIds(designer);
  projectId = ids.projectId;
  // Letters and digits only, so the database's collation orders them as plain text does.
  prefix = `KS${process.pid % 1000}${Date.now() % 100000}X`;
  const inputs = fixtureInputs('kestrel-single-point-ecc');
  // Made in an order of their own: code order, title order and creation order all differ.
  const order = Array.from({ length: COUNT }, (_, i) => (i * 7) % COUNT);
  for (const n of order) {
    const code = `${prefix}${String(n).padStart(2, '0')}`;
    const title = `Paging check ${String((n * 5) % COUNT).padStart(2, '0')} of ${prefix}`;
    const body = await json(await send(designer, 'POST', `/api/projects/${projectId}/studies`, { code, title, kind: 'bonding', limitSetId: ids.limitSetId, inputs }), 201);
    made.push({ id: body.study.id, code, title });
  }
}, 120_000);

/** Every page in turn, following `next`, as the studies table does. */
async function walk(sort: string, direction: string) {
  const codes: string[] = [];
  let after: string | null = null;
  let total = -1;
  for (let pages = 0; pages < 20; pages++) {
    const q = new URLSearchParams({ pageSize: String(PAGE), sort, direction, search: prefix, ...(after ? { after } : {}) });
    const page = await json(await designer.fetch(`/api/projects/${projectId}/studies?${q}`), 200);
    expect(page.rows.length).toBeLessThanOrEqual(PAGE);
    total = page.total;
    codes.push(...page.rows.map((r: { code: string }) => r.code));
    after = page.next;
    if (!after) break;
  }
  return { codes, total };
}

const byText = (key: 'code' | 'title') => [...made].sort((a, b) => (a[key] < b[key] ? -1 : 1)).map((m) => m.code);

describe('the studies list', () => {
  it('gives every study once, page after page, in code, title and change order both ways', { timeout: 60_000 }, async () => {
    const expected: Record<string, string[]> = { code: byText('code'), title: byText('title'), updated: made.map((m) => m.code) };
    for (const sort of ['code', 'title', 'updated']) {
      for (const direction of ['asc', 'desc']) {
        const { codes, total } = await walk(sort, direction);
        expect(total).toBe(COUNT);
        expect(codes, `${sort} ${direction}`).toEqual(direction === 'asc' ? expected[sort] : [...expected[sort]].reverse());
      }
    }
  });

  it('shows the latest revision of each study and filters by stage and kind', async () => {
    const q = new URLSearchParams({ pageSize: '50', search: prefix, state: 'draft', kind: 'bonding' });
    const page = await json(await designer.fetch(`/api/projects/${projectId}/studies?${q}`), 200);
    expect(page.total).toBe(COUNT);
    expect(page.rows.every((r: { revisionNumber: number; state: string; kind: string }) => r.revisionNumber === 1 && r.state === 'draft' && r.kind === 'bonding')).toBe(true);
    const none = await json(await designer.fetch(`/api/projects/${projectId}/studies?${new URLSearchParams({ search: prefix, state: 'issued' })}`), 200);
    expect(none).toMatchObject({ total: 0, rows: [], next: null });
  });

  it('refuses a page position it did not give out, or gave out for another order, naming the field', async () => {
    const position = (order: string, key: string, id = made[0].id) => Buffer.from(JSON.stringify([order, [key], id])).toString('base64url');
    const byCode = await json(await designer.fetch(`/api/projects/${projectId}/studies?${new URLSearchParams({ pageSize: '5', sort: 'code', search: prefix })}`), 200);
    const byUpdated = await json(await designer.fetch(`/api/projects/${projectId}/studies?${new URLSearchParams({ pageSize: '5', sort: 'updated', search: prefix })}`), 200);
    const refused: Array<[string, Record<string, string>]> = [
      ['not-a-position', {}],
      [position('code asc', 'K1', 'no-id'), {}],
      // Well formed, but no time: it must not reach the database as one.
      [position('updated asc', 'not a date'), { sort: 'updated' }],
      [position('updated asc', '2026-02-30 10:00:00+00'), { sort: 'updated' }],
      // Stale: given out for another sort or direction.
      [byCode.next, { sort: 'updated' }],
      [byUpdated.next, { sort: 'code' }],
      [byCode.next, { sort: 'code', direction: 'desc' }],
    ];
    for (const [after, order] of refused) {
      const body = await json(await designer.fetch(`/api/projects/${projectId}/studies?${new URLSearchParams({ ...order, after })}`), 422);
      expect(body.fields, after).toEqual([{ field: 'after', message: expect.stringContaining('start from the first page') }]);
    }
  });
});
