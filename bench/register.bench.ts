// npm run bench:register (through scripts/bench-server.sh): latency of the register's pages
// with 5,000 assets in one project (half covered by the demo's issued study, each owing four
// obligations with due dates spread over two years), 20 connections, on loopback. The assets are
// inserted in SQL: the asset_summaries triggers fill the register's table as for any write. Figures only;
// the target is p95 ≤ 100 ms per route (issue 16). On 2 shared cores, run it with nothing else busy.
import autocannon from 'autocannon';
import pg from 'pg';
import { signedIn } from '../tests/helpers/http-session';
import { DEMO_PASSWORD } from '../tests/helpers/env';

const base = process.env.APP_URL!;
const ASSETS = 5_000;
const CONNECTIONS = 20;
const SECONDS = Number(process.env.BENCH_SECONDS ?? 8);
const TARGET_P95_MS = 100;

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];

/** 5,000 generated assets of the demo owner standard, their standing and study links, in SQL. */
async function seedAssets(db: pg.Client) {
  const t0 = performance.now();
  const { rows: [demo] } = await db.query(`select a.project_id, a.owner_standard, a.created_by, sa.study_id from assets a join study_assets sa on sa.asset_id = a.id limit 1`);
  await db.query('begin');
  await db.query(
    `insert into assets (project_id, kind, site_kind, code, name, route, owner_standard, in_service_on, created_by)
     select $1, case when n % 3 = 0 then 'site'::asset_kind else 'circuit'::asset_kind end, case when n % 3 = 0 then 'link-box-group' end,
       'Z' || lpad(n::text, 5, '0'), 'Generated asset ' || n || ' (benchmark)', '', $2, current_date - (n % 900), $3
     from generate_series(1, ${ASSETS}) n`,
    [demo.project_id, demo.owner_standard, demo.created_by],
  );
  await db.query(`insert into study_assets (study_id, asset_id) select $1, id from assets where code like 'Z%' and substr(code, 6, 1) in ('0', '2', '4', '6', '8')`, [demo.study_id]);
  await db.query(`
    insert into asset_obligations (asset_id, obligation_type_id, next_due_on)
    select a.id, t.id, current_date + ((hashtext(a.code || t.name) % 730))
    from assets a join obligation_types t on t.owner_standard = a.owner_standard and (t.applies_to = a.kind::text or t.applies_to = 'both')
    where a.code like 'Z%'`);
  await db.query('commit');
  // As autovacuum would leave a table that grew over months: dead row versions from the
  // summary triggers gone, the trigram indexes' pending entries merged, statistics current.
  await db.query('vacuum analyze');
  console.log(`seeded ${ASSETS} assets in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  return demo.project_id as string;
}

async function load(label: string, cookie: string, requests: autocannon.Request[]) {
  const times: number[] = [];
  const statuses = new Map<number, number>();
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url: base, connections: CONNECTIONS, duration: SECONDS, headers: { cookie, origin: base }, requests }, (err, res) => (err ? reject(err) : resolve(res)));
    instance.on('response', (_client, status, _bytes, ms) => {
      times.push(ms);
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
    });
  });
  times.sort((a, b) => a - b);
  const p95 = percentile(times, 95);
  const codes = [...statuses].map(([s, n]) => `${s}×${n}`).join(' ');
  console.log(`${label.padEnd(44)} p50 ${percentile(times, 50).toFixed(0).padStart(5)} ms  p95 ${p95.toFixed(0).padStart(5)} ms  p99 ${percentile(times, 99).toFixed(0).padStart(5)} ms  ${result.requests.average.toFixed(0).padStart(5)} req/s  [${codes}]  ${p95 <= TARGET_P95_MS ? 'within' : 'OVER'} the ${TARGET_P95_MS} ms target`);
}

const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
await db.connect();
const projectId = await seedAssets(db);
await db.end();

const designer = await signedIn('designer@sheathwise.example', DEMO_PASSWORD);
const cookie = designer.cookieHeader();

// Keyset positions deep into the register, collected by walking it once per sort.
const sorts = ['code', 'name', 'status', 'nextDue', 'margin'] as const;
const deep: autocannon.Request[] = [];
for (const sort of sorts) {
  let after: string | null = null;
  for (let page = 0; page < 40; page++) {
    const res: { next: string | null } = await (await designer.fetch(`/api/projects/${projectId}/register?pageSize=50&sort=${sort}${after ? `&after=${after}` : ''}`)).json();
    if (page % 8 === 0) deep.push({ method: 'GET', path: `/api/projects/${projectId}/register?pageSize=50&sort=${sort}${after ? `&after=${after}` : ''}` });
    after = res.next;
    if (!after) break;
  }
}
console.log(`\n${CONNECTIONS} connections, ${SECONDS} s per route, ${ASSETS} assets in the project\n`);
// What any signed-in request costs on this machine at this moment (session, middleware, JSON):
// the floor under the register's figures, so that a busy machine can be told from a slow query.
await load('baseline: GET /api/me (no register work)', cookie, [{ method: 'GET', path: '/api/me' }]);
await load('register, first page, sorted by code', cookie, [{ method: 'GET', path: `/api/projects/${projectId}/register?pageSize=50` }]);
await load('register, deep pages, every sort', cookie, deep);
await load('register, status filter (overdue)', cookie, [{ method: 'GET', path: `/api/projects/${projectId}/register?pageSize=50&status=overdue&sort=nextDue` }]);
await load('register, search', cookie, [{ method: 'GET', path: `/api/projects/${projectId}/register?pageSize=50&search=Z012` }]);
await load('register across projects, sorted by status', cookie, [{ method: 'GET', path: '/api/register?pageSize=50&sort=status' }]);
