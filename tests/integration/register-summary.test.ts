import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { drizzle } from 'drizzle-orm/node-postgres';
import { createDatabase, type Database } from '../../src/lib/db/client';
import * as schema from '../../src/lib/db/schema';
import { listRegister, type RegisterRow } from '../../src/lib/register/register-query';
import { addDays } from '../../src/lib/register/due-dates';
import { registerQuerySchema } from '../../src/lib/schemas/register.schema';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoSessions, drive, json, prepareForSubmit, send } from '../helpers/workflow-api';
import { computedRegister, type ComputedRow } from './register-computed';
import { daysFromToday, issuedStudy, newAsset, ownStandard, registerRows, tag, todayUtc } from './register.fixture';

// The register reads asset_summaries, kept current by triggers in the writer's transaction.
// Each write that changes what the register shows of an asset (asset edits, study links,
// obligation records and types, issue and supersede of a revision, remarks, re-validation by
// new system data, removal) must show in the register at once, and the summary must equal the
// register computed from the source tables the old way (register-computed.ts, the status from
// registerStatus() itself). The study is the invented demo route (20 kA earth fault).

let sessions: Record<DemoRole, HttpSession>;
let db: Database;
let pool: ReturnType<typeof createDatabase>['pool'];
let study: Awaited<ReturnType<typeof issuedStudy>>;
let std: Awaited<ReturnType<typeof ownStandard>>;
const t = tag();
const code = { circuit: `SM${t}-CIRCUIT`, site: `SM${t}-SITE` };
const ids: Record<'circuit' | 'site', string> = { circuit: '', site: '' };

const FIELDS = ['id', 'kind', 'code', 'name', 'issued', 'issuedCount', 'worstMarginPct', 'openRemarks', 'openReviews', 'done', 'dueSoon', 'overdue', 'nextDueOn', 'status'] as const;
const pick = (r: Record<string, unknown> | ComputedRow | RegisterRow) => Object.fromEntries(FIELDS.map((f) => [f, (r as Record<string, unknown>)[f]]));

/** The asset's register row through the API, checked against the register computed from the source tables. */
async function current(which: 'circuit' | 'site') {
  const rows = await registerRows(sessions.designer, `search=${encodeURIComponent(code[which])}`);
  const computed = (await computedRegister(db, [study.projectId], todayUtc())).get(ids[which]);
  const row = rows.find((r) => r.id === ids[which]);
  expect(row && pick(row), `${which} in the register`).toEqual(computed && pick(computed));
  return row as unknown as RegisterRow;
}

beforeAll(async () => {
  ({ db, pool } = createDatabase(testEnv().databaseUrl, 3));
  sessions = await demoSessions();
  [study, std] = await Promise.all([issuedStudy(sessions), ownStandard(sessions.admin)]);
  // The circuit's oversheath test fell due at entry into service, 40 days ago; the site's inspection is due in 5 days.
  ids.circuit = (await newAsset(sessions.designer, study.projectId, { kind: 'circuit', code: code.circuit, name: 'Summary circuit (invented)', ownerStandard: std.ownerStandard, inServiceOn: daysFromToday(-40) })).id;
  ids.site = (await newAsset(sessions.designer, study.projectId, { kind: 'site', siteKind: 'substation', code: code.site, name: 'Summary substation (invented)', ownerStandard: std.ownerStandard, inServiceOn: daysFromToday(5) })).id;
}, 180_000);

afterAll(async () => {
  await pool?.end();
});

describe('the register summary follows every write', { timeout: 120_000 }, () => {
  it('a new asset: no issued study', async () => {
    expect((await current('circuit')).status).toBe('no issued study');
    expect((await current('site')).status).toBe('no issued study');
  });

  it('linking a study: covered by its issued revision, status from the due dates', async () => {
    await json(await send(sessions.designer, 'POST', `/api/assets/${ids.circuit}/studies`, { studyId: study.studyId, studyCircuitId: 'C1' }), 201);
    await json(await send(sessions.designer, 'POST', `/api/assets/${ids.site}/studies`, { studyId: study.studyId, siteEnd: 'end' }), 201);
    const circuit = await current('circuit');
    expect(circuit).toMatchObject({ issued: `${study.code} rev 1`, issuedCount: 1, status: 'overdue', overdue: 1 });
    expect(circuit.worstMarginPct).not.toBeNull();
    expect(await current('site')).toMatchObject({ status: 'due within 30 days', dueSoon: 1 });
  });

  it('editing an asset: its name, and its due dates from a new service date', async () => {
    await json(await send(sessions.designer, 'PATCH', `/api/assets/${ids.circuit}`, { name: 'Renamed summary circuit (invented)', inServiceOn: daysFromToday(400) }), 200);
    expect(await current('circuit')).toMatchObject({ name: 'Renamed summary circuit (invented)', nextDueOn: daysFromToday(400), overdue: 0, status: 'covered' });
  });

  it('recording an obligation: done, and the next due date a year on', async () => {
    const form = new FormData();
    for (const [k, v] of Object.entries({ obligationTypeId: std.inspectionId, doneOn: todayUtc(), performedBy: 'Test contractor (invented)', values: '', remarks: '' })) form.set(k, v);
    expect((await sessions.designer.fetch(`/api/assets/${ids.site}/records`, { method: 'POST', body: form })).status).toBe(201);
    const site = await current('site');
    expect(site).toMatchObject({ done: 1, status: 'covered' });
    expect(site.nextDueOn! > addDays(todayUtc(), 300)).toBe(true);
  });

  it('a new obligation type: every asset of the standard owes it at once', async () => {
    await json(await send(sessions.admin, 'POST', '/api/admin/obligation-types', { ownerStandard: std.ownerStandard, name: 'Bonding continuity test', appliesTo: 'both', firstDueMonths: 0, intervalMonths: 60, criterion: null, basis: 'Invented for the tests' }), 201);
    expect(await current('site')).toMatchObject({ nextDueOn: daysFromToday(5), dueSoon: 1, status: 'due within 30 days' });
    expect(await current('circuit')).toMatchObject({ status: 'covered' });
  });

  let revision2 = '';
  it('a remark on the study\'s latest revision counts as open', async () => {
    revision2 = (await json(await send(sessions.designer, 'POST', `/api/studies/${study.studyId}/revisions`), 201)).id;
    await json(await send(sessions.designer, 'POST', `/api/revisions/${revision2}/remarks`, { body: 'Check the new route section lengths.' }), 201);
    expect(await current('circuit')).toMatchObject({ openRemarks: 1, issued: `${study.code} rev 1` });
  });

  it('writes racing from both sides (remarks on the study, records on the asset) leave the summary current', async () => {
    // Each side refreshes the asset's summary in its own transaction; the refresh waits for the
    // other's lock and reads after it commits, so neither overwrites the other with stale figures.
    const record = (i: number) => {
      const form = new FormData();
      for (const [k, v] of Object.entries({ obligationTypeId: std.oversheathId, doneOn: daysFromToday(-i), performedBy: `Race contractor ${i} (invented)`, values: '5, 6', remarks: '' })) form.set(k, v);
      return sessions.designer.fetch(`/api/assets/${ids.circuit}/records`, { method: 'POST', body: form });
    };
    const results = await Promise.all(Array.from({ length: 4 }, (_, i) => [send(sessions.checker, 'POST', `/api/revisions/${revision2}/remarks`, { body: `Race remark ${i}.` }), record(i)]).flat());
    expect(results.map((r) => r.status)).toEqual(Array(8).fill(201));
    expect(await current('circuit')).toMatchObject({ openRemarks: 5, done: 1 });
  });

  it('issuing the next revision supersedes the first: covered by revision 2', async () => {
    await json(await send(sessions.designer, 'POST', `/api/revisions/${revision2}/calculate`), 200);
    await prepareForSubmit(sessions.designer, revision2);
    await drive(sessions, revision2, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    expect(await current('circuit')).toMatchObject({ issued: `${study.code} rev 2`, issuedCount: 1, openRemarks: 0 });
    await current('site');
  });

  it('publishing a higher earth-fault level puts both assets of the study under review', async () => {
    await json(await send(sessions.approver, 'POST', `/api/assets/${ids.site}/system-data`, { earthFaultKa: 25, source: 'Network operator letter (invented)', sourceDate: '2026-11-01' }), 201);
    expect(await current('site')).toMatchObject({ openReviews: 1, status: 'needs review' });
    expect(await current('circuit')).toMatchObject({ openReviews: 1, status: 'needs review' });
  });

  it('editing and removing a study link', async () => {
    await json(await send(sessions.designer, 'PATCH', `/api/assets/${ids.site}/studies/${study.studyId}`, { siteEnd: 'start' }), 200);
    expect(await current('site')).toMatchObject({ status: 'needs review' });
    await json(await send(sessions.designer, 'DELETE', `/api/assets/${ids.circuit}/studies/${study.studyId}`), 200);
    expect(await current('circuit')).toMatchObject({ issued: '', issuedCount: 0, openReviews: 0, openRemarks: 0, status: 'no issued study' });
  });

  it('removing an asset takes it off the register', async () => {
    await json(await send(sessions.designer, 'DELETE', `/api/assets/${ids.site}`), 200);
    expect(await registerRows(sessions.designer, `search=${encodeURIComponent(code.site)}`)).toEqual([]);
    expect((await computedRegister(db, [study.projectId], todayUtc())).has(ids.site)).toBe(false);
  });
});

describe('the summary register equals the register computed from the source tables', { timeout: 120_000 }, () => {
  // One repeatable-read snapshot for both readings, so that other tests writing meanwhile cannot
  // make them differ. Three "todays" move every due date across the status boundaries.
  it.each([0, -400, 400])('on the seeded data, today %+d days: every row, every field', async (offset) => {
    const client = await pool.connect();
    try {
      await client.query('begin isolation level repeatable read');
      const snapshot = drizzle(client, { schema }) as unknown as Database;
      const today = daysFromToday(offset);
      const computed = await computedRegister(snapshot, [study.projectId], today);
      const read: RegisterRow[] = [];
      let after: string | undefined;
      do {
        const page = await listRegister(snapshot, [study.projectId], registerQuerySchema.parse({ pageSize: 200, after }), today);
        read.push(...page.rows);
        after = page.next ?? undefined;
      } while (after);
      expect(read.length).toBe(computed.size);
      expect(read.some((r) => r.code === 'FHX-C1'), 'the demo register is seeded').toBe(true);
      for (const row of read) expect(pick(row), row.code).toEqual(pick(computed.get(row.id)!));
      const statuses = new Set(read.map((r) => r.status));
      expect(statuses.size, [...statuses].join(', ')).toBeGreaterThanOrEqual(2);
    } finally {
      await client.query('rollback');
      client.release();
    }
  });
});
