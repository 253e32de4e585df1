import { sql, type SQL } from 'drizzle-orm';
import Papa from 'papaparse';
import type { Database } from '../db/client';
import { AppError } from '../errors';
import type { RegisterQuery } from '../schemas/register.schema';
import { addDays } from './due-dates';
import { DUE_SOON_DAYS, registerStatuses, type RegisterStatus } from './register-status';

export interface RegisterRow {
  id: string;
  projectId: string;
  projectCode: string;
  kind: 'circuit' | 'site';
  code: string;
  name: string;
  /** Covering issued revisions, e.g. "B01 rev 2, B04 rev 1". */
  issued: string;
  issuedCount: number;
  worstMarginPct: number | null;
  openRemarks: number;
  openReviews: number;
  done: number;
  dueSoon: number;
  overdue: number;
  nextDueOn: string | null;
  status: RegisterStatus;
}

// The status order of registerStatus(), as SQL, so that filters, sorting and paging happen in
// the database. registerStatus() stays the definition; the integration tests hold them together.
const statusRank = sql`case when r.issued_count = 0 then 0 when r.open_reviews > 0 then 1 when r.overdue > 0 then 2 when r.due_soon > 0 then 3 else 4 end`;

const SORT_KEYS: Record<RegisterQuery['sort'], SQL> = {
  code: sql`r.code`,
  name: sql`r.name`,
  status: statusRank,
  nextDue: sql`coalesce(r.next_due_on, '9999-12-31'::date)`,
  margin: sql`coalesce(r.worst_margin_pct, 1e9)::float8`,
};

/**
 * Every asset of the projects with what the register shows of it. One statement: the per-asset
 * figures are lateral index look-ups (links, issued revisions, their worst computed margin,
 * open remark threads, open reviews, obligation standing), so the cost grows with the assets
 * asked for, not with the history behind them.
 */
function registerRows(projectIds: string[], q: Pick<RegisterQuery, 'kind' | 'search'>, today: string) {
  const soon = addDays(today, DUE_SOON_DAYS);
  return sql`
    select a.id, a.project_id, p.code as project_code, a.kind, a.code, a.name,
      coalesce(iss.issued, '') as issued, coalesce(iss.issued_count, 0) as issued_count, iss.worst_margin_pct,
      coalesce(rem.open_remarks, 0) as open_remarks, coalesce(rev.open_reviews, 0) as open_reviews,
      coalesce(ob.done, 0) as done, coalesce(ob.due_soon, 0) as due_soon, coalesce(ob.overdue, 0) as overdue, ob.next_due_on, to_char(ob.next_due_on, 'YYYY-MM-DD') as next_due_text
    from assets a
    join projects p on p.id = a.project_id
    left join lateral (
      select count(*)::int as issued_count, string_agg(s.code || ' rev ' || rv.number, ', ' order by s.code) as issued, min(m.worst)::float8 as worst_margin_pct
      from study_assets sa
      join studies s on s.id = sa.study_id
      join revisions rv on rv.study_id = s.id and rv.state = 'issued'
      left join lateral (select min(ci.margin_pct) as worst from checklist_items ci where ci.revision_id = rv.id and ci.kind = 'computed') m on true
      where sa.asset_id = a.id
    ) iss on true
    left join lateral (
      select sum(ss.open_remarks)::int as open_remarks from study_assets sa join study_summaries ss on ss.study_id = sa.study_id where sa.asset_id = a.id
    ) rem on true
    left join lateral (
      select count(*)::int as open_reviews
      from study_assets sa join study_reviews sr on sr.study_id = sa.study_id join revisions rv on rv.id = sr.revision_id and rv.state = 'issued'
      where sa.asset_id = a.id
    ) rev on true
    left join lateral (
      select count(*) filter (where ao.last_done_on is not null)::int as done,
        count(*) filter (where ao.next_due_on >= ${today}::date and ao.next_due_on <= ${soon}::date)::int as due_soon,
        count(*) filter (where ao.next_due_on < ${today}::date)::int as overdue,
        min(ao.next_due_on) as next_due_on
      from asset_obligations ao where ao.asset_id = a.id
    ) ob on true
    where ${assetFilter(projectIds, q)}`;
}

/** The conditions on the assets themselves (projects, kind, search): no per-asset figures needed. */
function assetFilter(projectIds: string[], q: Pick<RegisterQuery, 'kind' | 'search'>) {
  const search = q.search ? `%${q.search.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null;
  return sql`a.project_id in (${sql.join(projectIds.map((id) => sql`${id}::uuid`), sql`, `)})
      ${q.kind ? sql`and a.kind = ${q.kind}` : sql``}
      ${search ? sql`and (a.code ilike ${search} or a.name ilike ${search})` : sql``}`;
}

interface RawRow {
  id: string;
  project_id: string;
  project_code: string;
  kind: 'circuit' | 'site';
  code: string;
  name: string;
  issued: string;
  issued_count: number;
  worst_margin_pct: number | null;
  open_remarks: number;
  open_reviews: number;
  done: number;
  due_soon: number;
  overdue: number;
  next_due_text: string | null;
  rank: number;
  sort_key: string;
}

const toRow = (r: RawRow): RegisterRow => ({
  id: r.id,
  projectId: r.project_id,
  projectCode: r.project_code,
  kind: r.kind,
  code: r.code,
  name: r.name,
  issued: r.issued,
  issuedCount: r.issued_count,
  worstMarginPct: r.worst_margin_pct === null ? null : Number(r.worst_margin_pct),
  openRemarks: r.open_remarks,
  openReviews: r.open_reviews,
  done: r.done,
  dueSoon: r.due_soon,
  overdue: r.overdue,
  nextDueOn: r.next_due_text,
  status: registerStatuses[r.rank],
});

const encodeCursor = (key: string, id: string) => Buffer.from(JSON.stringify([key, id])).toString('base64url');

function decodeCursor(after: string): [string, string] {
  try {
    const [key, id] = JSON.parse(Buffer.from(after, 'base64url').toString('utf8'));
    if (typeof key === 'string' && typeof id === 'string' && /^[0-9a-f-]{36}$/i.test(id)) return [key, id];
  } catch {
    // fall through to the error below
  }
  throw new AppError('InvalidInput', undefined, [{ field: 'after', message: 'This page position is not one the register gave out: start from the first page.' }]);
}

/**
 * A page of the register, keyset-paged: `after` is the position of the last row shown, so a
 * page costs the same at any depth and rows added meanwhile neither repeat nor go missing.
 */
export async function listRegister(db: Database, projectIds: string[], q: RegisterQuery, today: string) {
  if (!projectIds.length) return { total: 0, rows: [] as RegisterRow[], next: null as string | null };
  const key = SORT_KEYS[q.sort];
  const cmp = q.direction === 'asc' ? sql`>` : sql`<`;
  const dir = q.direction === 'asc' ? sql`asc` : sql`desc`;
  const statusFilter = q.status ? sql`and ${statusRank} = ${registerStatuses.indexOf(q.status)}` : sql``;
  let position = sql``;
  if (q.after) {
    const [k, id] = decodeCursor(q.after);
    const typed = q.sort === 'nextDue' ? sql`${k}::date` : q.sort === 'margin' ? sql`${k}::float8` : q.sort === 'status' ? sql`${k}::int` : sql`${k}::text`;
    position = sql`and (${key}, r.id) ${cmp} (${typed}, ${id}::uuid)`;
  }
  const base = registerRows(projectIds, q, today);
  const [page, count] = await Promise.all([
    db.execute(sql`select r.*, ${statusRank} as rank, (${key})::text as sort_key from (${base}) r where true ${statusFilter} ${position} order by ${key} ${dir}, r.id ${dir} limit ${q.pageSize + 1}`),
    // Without a status filter the total needs no per-asset figures: count the assets alone.
    q.status ? db.execute(sql`select count(*)::int as total from (${base}) r where true ${statusFilter}`) : db.execute(sql`select count(*)::int as total from assets a where ${assetFilter(projectIds, q)}`),
  ]);
  const raw = page.rows as unknown as RawRow[];
  const more = raw.length > q.pageSize;
  const rows = raw.slice(0, q.pageSize);
  const last = rows[rows.length - 1];
  return { total: (count.rows[0] as { total: number }).total, rows: rows.map(toRow), next: more && last ? encodeCursor(last.sort_key, last.id) : null };
}

/** Counts per status of every asset of the projects, per project. */
export async function statusCounts(db: Database, projectIds: string[], today: string) {
  if (!projectIds.length) return [];
  const res = await db.execute(sql`select r.project_id, ${statusRank} as rank, count(*)::int as count from (${registerRows(projectIds, {}, today)}) r group by r.project_id, rank`);
  return (res.rows as Array<{ project_id: string; rank: number; count: number }>).map((r) => ({ projectId: r.project_id, status: registerStatuses[r.rank], count: r.count }));
}

const CSV_FIELDS = ['project', 'asset', 'kind', 'name', 'status', 'covering issued revisions', 'worst margin %', 'open remarks', 'obligations done', 'due within 30 days', 'overdue', 'next due (UTC date)'];

/**
 * The whole filtered register as CSV (papaparse). Cells that a spreadsheet would run as a
 * formula (starting with = + - @, tab or carriage return) are prefixed with a quote mark.
 */
export async function exportRegisterCsv(db: Database, projectIds: string[], q: RegisterQuery, today: string): Promise<string> {
  const rows: RegisterRow[] = [];
  let after: string | undefined;
  do {
    const page = await listRegister(db, projectIds, { ...q, pageSize: 200, after }, today);
    rows.push(...page.rows);
    after = page.next ?? undefined;
  } while (after && rows.length < 100_000);
  const data = rows.map((r) => [r.projectCode, r.code, r.kind, r.name, r.status, r.issued, r.worstMarginPct === null ? '' : Math.round(r.worstMarginPct), r.openRemarks, r.done, r.dueSoon, r.overdue, r.nextDueOn ?? '']);
  return Papa.unparse({ fields: CSV_FIELDS, data }, { escapeFormulae: true, newline: '\r\n' }) + '\r\n';
}

/** Status counts per day since `fromDay`, summed over the projects (for the chart). */
export async function registerHistory(db: Database, projectIds: string[], fromDay: string) {
  if (!projectIds.length) return [];
  const res = await db.execute(sql`
    select to_char(day, 'YYYY-MM-DD') as day, status, sum(count)::int as count from register_snapshots
    where project_id in (${sql.join(projectIds.map((id) => sql`${id}::uuid`), sql`, `)}) and day >= ${fromDay}::date
    group by day, status order by day`);
  return res.rows as Array<{ day: string; status: RegisterStatus; count: number }>;
}
