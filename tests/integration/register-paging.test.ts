import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoSessions, json, send } from '../helpers/workflow-api';
import { makeOutsider } from './outsider.fixture';
import { daysFromToday, issuedStudy, newAsset, ownStandard, registerRows, tag } from './register.fixture';

// The register through its endpoints: keyset pages that together hold every row once in the
// sorted order, filters that agree with the rows' own fields, the status in words, CSV whose
// cells cannot run as spreadsheet formulas, and nothing of another project.

let sessions: Record<DemoRole, HttpSession>;
const t = tag();
const prefix = `PG${t}`;
const N = 36;

beforeAll(async () => {
  sessions = await demoSessions();
  const study = await issuedStudy(sessions);
  const std = await ownStandard(sessions.admin);
  const created = [];
  for (let i = 0; i < N; i++) {
    // Every third asset: an oversheath test overdue (in service 40 days ago), due soon (in 10 days) or far off (in 400 days).
    const inServiceOn = [daysFromToday(-40), daysFromToday(10), daysFromToday(400)][i % 3];
    const name = i === 0 ? '=HYPERLINK("http://example.invalid","x")' : i === 1 ? '@SUM(1,2)' : `Asset ${String(N - i).padStart(2, '0')} (invented)`;
    created.push(newAsset(sessions.designer, study.projectId, { kind: i % 4 === 0 ? 'site' : 'circuit', siteKind: i % 4 === 0 ? 'link-box-group' : undefined, code: `${prefix}-${String(i).padStart(2, '0')}`, name, ownerStandard: std.ownerStandard, inServiceOn }));
  }
  const assets = await Promise.all(created);
  // Half are covered by the issued study; the rest have no issued study.
  for (const a of assets.filter((_, i) => i % 2 === 0)) await json(await send(sessions.designer, 'POST', `/api/assets/${a.id}/studies`, { studyId: study.studyId }), 201);
}, 180_000);

describe('register paging, sorting and filters', () => {
  it.each([
    ['code', 'asc'],
    ['code', 'desc'],
    ['name', 'asc'],
    ['status', 'asc'],
    ['nextDue', 'desc'],
    ['margin', 'asc'],
  ])('pages sorted by %s %s hold every row once, in order', async (sort, direction) => {
    const rows = await registerRows(sessions.designer, `search=${prefix}&pageSize=5&sort=${sort}&direction=${direction}`);
    expect(rows).toHaveLength(N);
    expect(new Set(rows.map((r) => r.id)).size).toBe(N);
    const key = (r: Record<string, unknown>) =>
      sort === 'status' ? ['no issued study', 'needs review', 'overdue', 'due within 30 days', 'covered'].indexOf(r.status as string) : sort === 'nextDue' ? (r.nextDueOn ?? '9999-12-31') : sort === 'margin' ? (r.worstMarginPct ?? 1e9) : r[sort];
    const keys = rows.map(key);
    const sorted = [...keys].sort((a, b) => (a! < b! ? -1 : a! > b! ? 1 : 0));
    expect(keys).toEqual(direction === 'asc' ? sorted : sorted.reverse());
  });

  it('says the status in words from the obligations and the covering studies', async () => {
    const rows = await registerRows(sessions.designer, `search=${prefix}&pageSize=200`);
    const byCode = Object.fromEntries(rows.map((r) => [r.code, r]));
    for (let i = 0; i < N; i++) {
      const r = byCode[`${prefix}-${String(i).padStart(2, '0')}`];
      const expected = i % 2 === 1 ? 'no issued study' : ['overdue', 'due within 30 days', 'covered'][i % 3];
      expect(r.status, `asset ${i}`).toBe(expected);
      if (i % 2 === 0) expect(r.issued).toMatch(/^R\d+ rev 1$/);
      expect(r.overdue).toBe(i % 3 === 0 ? 1 : 0);
    }
  });

  it('filters by status and kind, with a total that matches the rows', async () => {
    for (const status of ['overdue', 'due within 30 days', 'covered', 'no issued study']) {
      const page = await json(await sessions.designer.fetch(`/api/register?search=${prefix}&status=${encodeURIComponent(status)}&pageSize=200`), 200);
      expect(page.rows.every((r: { status: string }) => r.status === status)).toBe(true);
      expect(page.total).toBe(page.rows.length);
    }
    const sites = await registerRows(sessions.designer, `search=${prefix}&kind=site`);
    expect(sites.length).toBe(Math.ceil(N / 4));
    const bad = await json(await sessions.designer.fetch('/api/register?status=fine&pageSize=0&after=nonsense'), 422);
    expect(bad.fields.map((f: { field: string }) => f.field).sort()).toEqual(['pageSize', 'status']);
    const badCursor = await json(await sessions.designer.fetch('/api/register?after=nonsense'), 422);
    expect(badCursor.fields[0].field).toBe('after');
    // A position given out for one sort, sent with another whose keys are numbers or dates: a
    // field error, never the database's complaint about a cast.
    const byCode = await json(await sessions.designer.fetch(`/api/register?search=${prefix}&pageSize=2&sort=code`), 200);
    for (const sort of ['margin', 'nextDue', 'status', 'name']) {
      const stale = await json(await sessions.designer.fetch(`/api/register?search=${prefix}&pageSize=2&sort=${sort}&after=${byCode.next}`), 422);
      expect(stale.fields, sort).toEqual([{ field: 'after', message: expect.stringContaining('start from the first page') }]);
    }
  });

  it('exports the filtered register as CSV with formula cells neutralised', async () => {
    const res = await sessions.auditor.fetch(`/api/register/export?search=${prefix}&sort=code`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/csv');
    const parsed = Papa.parse<string[]>(await res.text(), { skipEmptyLines: true });
    const [header, ...lines] = parsed.data;
    expect(header).toContain('status');
    expect(lines).toHaveLength(N);
    const names = lines.map((l) => l[header.indexOf('name')]);
    expect(names).toContain('\'=HYPERLINK("http://example.invalid","x")');
    expect(names).toContain('\'@SUM(1,2)');
    expect(lines.every((l) => !/^[=+\-@]/.test(l.join('')))).toBe(true);
  });

  it('shows an outsider nothing of the project, and refuses them its register', async () => {
    const outsider = await makeOutsider();
    const rows = await registerRows(outsider.session, `search=${prefix}`);
    expect(rows).toHaveLength(0);
    const { projectId } = (await registerRows(sessions.designer, `search=${prefix}-00`))[0] as { projectId: string };
    expect((await outsider.session.fetch(`/api/projects/${projectId}/register`)).status).toBe(403);
    expect((await outsider.session.fetch(`/api/register?projectId=${projectId}`)).status).toBe(403);
  });
});
