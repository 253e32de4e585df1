// npm run bench:http (through scripts/bench-server.sh): request latency of the built server with
// 10,000 studies in one project, 20 connections at once, on loopback. Figures only; no asserts.
// The load generator shares the machine with the server: on 2 cores, run it with nothing else busy.
import { gzipSync } from 'node:zlib';
import autocannon from 'autocannon';
import pg from 'pg';
import { calculateStudy } from '../src/lib/calc';
import { GENESIS, eventHash } from '../src/lib/audit/audit-log';
import { compactResults } from '../src/lib/studies/stored-results';
import { signedIn } from '../tests/helpers/http-session';
import { DEMO_PASSWORD } from '../tests/helpers/env';
import { firstLoadScripts, scriptsNamedIn, totalBytes } from '../tests/helpers/first-load-js';
import { crossBondedRoute } from './reference-routes';

const base = process.env.APP_URL!;
const STUDIES = 10_000;
const CONNECTIONS = 20;
const SECONDS = Number(process.env.BENCH_SECONDS ?? 8);

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];

/** 10,000 studies copied from a calculated demo revision, checklist included, in SQL. */
async function seedStudies(db: pg.Client) {
  const t0 = performance.now();
  const { rows: [template] } = await db.query(`
    select r.id, s.project_id, s.limit_set_id, r.designer_id from revisions r join studies s on s.id = r.study_id
    where r.results is not null and s.kind = 'bonding' order by r.created_at limit 1`);
  await db.query('begin');
  await db.query(`
    with made as (
      insert into studies (project_id, code, title, kind, limit_set_id, created_by)
      select $1, 'K' || lpad(n::text, 5, '0'), 'Load study ' || n || ' (generated for the benchmark)', 'bonding', $2, $3 from generate_series(1, ${STUDIES}) n
      returning id
    )
    insert into revisions (study_id, number, state, machine_version, inputs, inputs_hash, results, results_check, results_inputs_hash, engine_version, limit_set_version_id, designer_id)
    select made.id, 1, 'draft', t.machine_version, t.inputs, t.inputs_hash, t.results, t.results_check, t.results_inputs_hash, t.engine_version, t.limit_set_version_id, t.designer_id
    from made, revisions t where t.id = $4`, [template.project_id, template.limit_set_id, template.designer_id, template.id]);
  // Every checklist column but the ids, whatever the schema holds today.
  const { rows: cols } = await db.query(`select column_name from information_schema.columns where table_name = 'checklist_items' and column_name not in ('id', 'revision_id') order by ordinal_position`);
  const list = cols.map((c: { column_name: string }) => `"${c.column_name}"`).join(', ');
  await db.query(`
    insert into checklist_items (revision_id, ${list})
    select r.id, ${cols.map((c: { column_name: string }) => (c.column_name === 'margin_pct' ? 'c.margin_pct * (0.5 + random())' : `c."${c.column_name}"`)).join(', ')}
    from revisions r join studies s on s.id = r.study_id and s.code like 'K%', checklist_items c where c.revision_id = $1`, [template.id]);
  await db.query('commit');
  // As autovacuum would leave tables that grew over months: statistics current, dead row
  // versions from the summary triggers gone.
  await db.query('vacuum analyze');
  console.log(`seeded ${STUDIES} studies in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  return template.project_id as string;
}

const AUDIT_EVENTS = 100_000;

/** 100,000 events chained onto the end of the audit trail (organisation-wide, invented), hashed as the app hashes them. */
async function seedAuditEvents(db: pg.Client) {
  const t0 = performance.now();
  const { rows: [last] } = await db.query('select hash from audit_events order by id desc limit 1');
  let prevHash: string = last?.hash ?? GENESIS;
  const start = Date.now();
  for (let from = 0; from < AUDIT_EVENTS; from += 5000) {
    const batch = Array.from({ length: Math.min(5000, AUDIT_EVENTS - from) }, (_, k) => {
      const fields = { at: new Date(start + from + k), actorId: null, type: 'bench.event', projectId: null, studyId: null, revisionId: null, detail: { n: from + k, note: 'generated for the benchmark' }, prevHash };
      const hash = eventHash(fields);
      prevHash = hash;
      return { ...fields, hash };
    });
    await db.query(
      `insert into audit_events (at, type, detail, prev_hash, hash)
       select at, type, detail, prev_hash, hash from unnest($1::timestamptz[], $2::text[], $3::jsonb[], $4::text[], $5::text[]) with ordinality as e(at, type, detail, prev_hash, hash, n) order by n`,
      [batch.map((e) => e.at.toISOString()), batch.map((e) => e.type), batch.map((e) => JSON.stringify(e.detail)), batch.map((e) => e.prevHash), batch.map((e) => e.hash)],
    );
  }
  console.log(`seeded ${AUDIT_EVENTS} audit events in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
}

/** BENCH_ROUTES=detail,calculate runs only the routes whose label contains one of the words. */
const only = process.env.BENCH_ROUTES?.split(',').filter(Boolean);

async function load(label: string, cookie: string, requests: autocannon.Request[], method = 'GET') {
  if (only && !only.some((word) => label.includes(word))) return;
  const times: number[] = [];
  const statuses = new Map<number, number>();
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url: base, connections: CONNECTIONS, duration: SECONDS, headers: { cookie, origin: base, 'content-type': 'application/json' }, method: method as autocannon.Request['method'], requests }, (err, res) => (err ? reject(err) : resolve(res)));
    instance.on('response', (_client, status, _bytes, ms) => {
      times.push(ms);
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
    });
  });
  times.sort((a, b) => a - b);
  const codes = [...statuses].map(([s, n]) => `${s}×${n}`).join(' ');
  console.log(`${label.padEnd(44)} p50 ${percentile(times, 50).toFixed(0).padStart(5)} ms  p95 ${percentile(times, 95).toFixed(0).padStart(5)} ms  p99 ${percentile(times, 99).toFixed(0).padStart(5)} ms  ${result.requests.average.toFixed(0).padStart(5)} req/s  [${codes}]`);
}

/** First-load JavaScript of a page, as served: every /_astro script it names and their static imports, gzipped. */
async function pageJsGzip(path: string, cookie: string): Promise<number> {
  const html = await (await fetch(base + path, { headers: { cookie } })).text();
  return totalBytes(await firstLoadScripts(scriptsNamedIn(html), async (file) => (await fetch(base + file)).text()));
}

const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
await db.connect();
// A rerun against a held server (BENCH_HOLD=1) finds the studies already there.
const { rows: [seeded] } = await db.query(`select project_id from studies where code = 'K00001'`);
const projectId: string = seeded?.project_id ?? (await seedStudies(db));
if (!seeded) await seedAuditEvents(db);
const { rows: [someRevision] } = await db.query(`select r.id from revisions r join studies s on s.id = r.study_id where s.code = 'K05000'`);
// The demo's issued revision: signed three times, with a history among the 100,000 events.
const { rows: [issuedRevision] } = await db.query(`select id from revisions where state = 'issued' order by created_at limit 1`);
// Twenty designers calculating their own studies: the requests cycle over 200 revisions.
const { rows: toCalculate } = await db.query(`select r.id from revisions r join studies s on s.id = r.study_id where s.code like 'K%' order by s.code limit 200`);
// Others, edited before each calculation (20 designers, 10 studies each).
const { rows: toEdit } = await db.query(`select r.id, r.inputs, r.version from revisions r join studies s on s.id = r.study_id where s.code like 'K%' order by s.code desc limit 200`);
await db.end();

const designer = await signedIn('designer@sheathwise.example', DEMO_PASSWORD);
const cookie = designer.cookieHeader();
// Positions all through the list, for every sort both ways: walked once in pages of 200 (a
// position is valid for any page size), then requested in pages of 25 as the table does.
const positions: string[] = [];
for (const sort of ['code', 'title', 'updated']) {
  for (const direction of ['asc', 'desc']) {
    let after: string | null = null;
    do {
      const q = new URLSearchParams({ pageSize: '200', sort, direction, ...(after ? { after } : {}) });
      const page = (await (await fetch(`${base}/api/projects/${projectId}/studies?${q}`, { headers: { cookie } })).json()) as { next: string | null };
      after = page.next;
      if (after) positions.push(`sort=${sort}&direction=${direction}&after=${after}`);
    } while (after);
  }
}
const studyPages = Array.from({ length: 60 }, (_, i) => ({
  method: 'GET' as const,
  path: `/api/projects/${projectId}/studies?pageSize=25&${i % 10 === 0 ? `sort=code` : positions[(i * 37) % positions.length]}`,
}));
console.log(`\n${CONNECTIONS} connections, ${SECONDS} s per route, ${STUDIES} studies in the project\n`);
await load('studies list (any page, any sort)', cookie, studyPages);
await load('revision detail', cookie, [{ method: 'GET', path: `/api/revisions/${someRevision.id}` }]);
await load('route profile of a case (recomputed)', cookie, [{ method: 'GET', path: `/api/revisions/${someRevision.id}/profile?caseId=LOAD` }]);
await load('home page queues (10,000 drafts waiting)', cookie, [{ method: 'GET', path: '/api/me/queue' }]);
await load('revision history (100,000 events)', cookie, [{ method: 'GET', path: `/api/revisions/${issuedRevision.id}/history` }]);
await load('sign-offs of an issued revision', cookie, [{ method: 'GET', path: `/api/revisions/${issuedRevision.id}/steps` }]);
const auditor = (await signedIn('auditor@sheathwise.example', DEMO_PASSWORD)).cookieHeader();
// As the audit screen asks for it: 20 events a page.
await load('audit trail, first page (auditor)', auditor, [{ method: 'GET', path: '/api/audit?pageSize=20' }]);
await load('health', cookie, [{ method: 'GET', path: '/api/health' }]);
await load('calculate (reference study, 200 revisions)', cookie, toCalculate.map((r: { id: string }) => ({ method: 'POST' as const, path: `/api/revisions/${r.id}/calculate` })));

/** Saves a changed title into a revision's inputs (a new inputs hash), then times its calculation. */
const versions = new Map<string, number>(toEdit.map((r: { id: string; version: number }) => [r.id, r.version]));
let edits = 0;
async function editAndCalculate(revision: { id: string; inputs: Record<string, unknown> }): Promise<{ ms: number; status: number }> {
  const inputs = { ...revision.inputs, title: `${String(revision.inputs.title)} (edit ${++edits})` };
  const put = await fetch(`${base}/api/revisions/${revision.id}/inputs`, { method: 'PUT', headers: { cookie, origin: base, 'content-type': 'application/json' }, body: JSON.stringify({ version: versions.get(revision.id), inputs }) });
  if (put.status !== 200) throw new Error(`saving inputs: ${put.status} ${await put.text()}`);
  versions.set(revision.id, ((await put.json()) as { version: number }).version);
  const t0 = performance.now();
  const res = await fetch(`${base}/api/revisions/${revision.id}/calculate`, { method: 'POST', headers: { cookie, origin: base } });
  const body = (await res.json()) as { version: number };
  if (res.ok) versions.set(revision.id, body.version);
  return { ms: performance.now() - t0, status: res.status };
}
if (!only || only.some((word) => 'calculate after an edit'.includes(word))) {
  // autocannon cannot chain a save and a calculation: 20 loops of fetch, for as long as the others.
  const times: number[] = [];
  const statuses = new Map<number, number>();
  const until = performance.now() + SECONDS * 1000;
  await Promise.all(
    Array.from({ length: CONNECTIONS }, async (_, c) => {
      const mine = toEdit.filter((_r: unknown, i: number) => i % CONNECTIONS === c);
      for (let n = 0; performance.now() < until; n++) {
        const { ms, status } = await editAndCalculate(mine[n % mine.length]);
        times.push(ms);
        statuses.set(status, (statuses.get(status) ?? 0) + 1);
      }
    }),
  );
  times.sort((a, b) => a - b);
  const codes = [...statuses].map(([st, k]) => `${st}×${k}`).join(' ');
  console.log(`${'calculate after an edit (timed: calculate only)'.padEnd(44)} p50 ${percentile(times, 50).toFixed(0).padStart(5)} ms  p95 ${percentile(times, 95).toFixed(0).padStart(5)} ms  p99 ${percentile(times, 99).toFixed(0).padStart(5)} ms  ${(times.length / SECONDS).toFixed(0).padStart(5)} calc/s  [${codes}]`);
}
if (!only) await extras();

/** Page sizes, audit verification and stored results size: everything but the route loads. */
async function extras() {
  // One more edit and calculation, for the incremental verification below to have new events.
  const calculateOnce = () => editAndCalculate(toEdit[0]);

  console.log('\nfirst-load JavaScript, gzipped:');
  // The audit trail is the auditor's screen; the others the designer's.
  for (const [page, who] of [['/signin', cookie], ['/', cookie], [`/projects/${projectId}`, cookie], [`/revisions/${someRevision.id}`, cookie], ['/audit', auditor]]) {
    console.log(`  ${page.padEnd(60)} ${(((await pageJsGzip(page, who)) / 1024)).toFixed(0).padStart(5)} kB`);
  }

  // The audit chain, as the administrator (every event): the whole chain, then from the checkpoint
  // that run left, after a few more events.
  const adminCookie = (await signedIn('admin@sheathwise.example', DEMO_PASSWORD)).cookieHeader();
  const timedVerify = async (mode: string) => {
    const t0 = performance.now();
    const report = await (await fetch(`${base}/api/audit/verify?mode=${mode}`, { headers: { cookie: adminCookie } })).json();
    return { ms: performance.now() - t0, report };
  };
  console.log(`\naudit verification (${AUDIT_EVENTS} generated events plus the demo's):`);
  for (let i = 0; i < 2; i++) {
    const full = await timedVerify('full');
    console.log(`  full:        ${full.ms.toFixed(0).padStart(6)} ms  ok=${full.report.ok} checked=${full.report.checked}`);
  }
  await calculateOnce();
  const incremental = await timedVerify('incremental');
  console.log(`  incremental: ${incremental.ms.toFixed(0).padStart(6)} ms  ok=${incremental.report.ok} checked=${incremental.report.checked} (events since the checkpoint)`);

  const large = crossBondedRoute({ circuits: 2, majorSections: 30, withEcc: true });
  const full = JSON.stringify(calculateStudy(large));
  const compact = JSON.stringify(compactResults(calculateStudy(large)));
  const sizeDb = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await sizeDb.connect();
  await sizeDb.query('create temp table stored_size (r jsonb)');
  await sizeDb.query('insert into stored_size values ($1::jsonb), ($2::jsonb)', [full, compact]);
  const { rows: onDisk } = await sizeDb.query('select pg_column_size(r) as bytes from stored_size');
  await sizeDb.end();
  const kB = (n: number) => `${(n / 1024).toFixed(0)} kB`;
  console.log('\nresults stored per revision, large route (90 minor sections, 2 circuits):');
  console.log(`  before (with route profiles): ${kB(full.length)} JSON, ${kB(gzipSync(full).length)} gzipped, ${kB(onDisk[0].bytes)} in PostgreSQL (jsonb, TOAST-compressed)`);
  console.log(`  now (profiles recomputed on request): ${kB(compact.length)} JSON, ${kB(gzipSync(compact).length)} gzipped, ${kB(onDisk[1].bytes)} in PostgreSQL`);
}
