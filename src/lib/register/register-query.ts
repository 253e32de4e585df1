import { sql, type SQL } from 'drizzle-orm';
import { decodeCursor, encodeCursor, type KeyType } from '../db/keyset-cursor';
import Papa from 'papaparse';
import type { Database } from '../db/client';
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

/**
 * The status of a summary row as its index in registerStatuses. `standing` holds the part that
 * does not depend on the date (0 no issued study, 1 needs review); for the rest the earliest due
 * date against today decides: before today, overdue; within the window, due soon; else covered.
 * registerStatus() stays the definition; the integration tests hold them together.
 */
const statusRank = (today: string, soon: string) =>
  sql`(case when s.standing < 2 then s.standing when s.next_due_on < ${today}::date then 2 when s.next_due_on <= ${soon}::date then 3 else 4 end)`;

// The earliest due date, with "nothing due" last: the expression the indexes hold.
const dueKey = sql`coalesce(s.next_due_on, '9999-12-31'::date)`;

/** Each status as a condition on stored columns: a range of the (project, standing, due) index. */
function statusCondition(status: RegisterStatus, today: string, soon: string): SQL {
  switch (status) {
    case 'no issued study':
      return sql`s.standing = 0`;
    case 'needs review':
      return sql`s.standing = 1`;
    case 'overdue':
      return sql`s.standing = 2 and ${dueKey} < ${today}::date`;
    case 'due within 30 days':
      return sql`s.standing = 2 and ${dueKey} >= ${today}::date and ${dueKey} <= ${soon}::date`;
    case 'covered':
      return sql`s.standing = 2 and ${dueKey} > ${soon}::date`;
  }
}

/**
 * Each sort as the columns of an index on asset_summaries after project_id (asset_id last).
 * Status sorts by standing, then the earliest due date: the status order of registerStatuses
 * (overdue, due soon and covered are ranges of the due date within standing 2) without
 * reference to today, so it pages by index too; within a status the soonest due comes first.
 */
const sortColumns = (sort: RegisterQuery['sort']): SQL[] =>
  ({
    code: [sql`s.code`],
    name: [sql`s.name`],
    status: [sql`s.standing`, dueKey],
    nextDue: [dueKey],
    margin: [sql`coalesce(s.worst_margin_pct, 1e9::float8)`],
  })[sort];

/** How the cursor's text of each sort column is typed back. */
const cursorTypes: Record<RegisterQuery['sort'], KeyType[]> = { code: ['text'], name: ['text'], status: ['smallint', 'date'], nextDue: ['date'], margin: ['float8'] };

/** The conditions on the summaries (projects, kind, search, status). */
function summaryFilter(projectIds: string[], q: Pick<RegisterQuery, 'kind' | 'search' | 'status'>, today: string, soon: string) {
  const search = q.search ? `%${q.search.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null;
  return sql`s.project_id in (${sql.join(projectIds.map((id) => sql`${id}::uuid`), sql`, `)})
      ${q.kind ? sql`and s.kind = ${q.kind}` : sql``}
      ${search ? sql`and (s.code ilike ${search} or s.name ilike ${search})` : sql``}
      ${q.status ? sql`and ${statusCondition(q.status, today, soon)}` : sql``}`;
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
  sort_key: string[];
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

/**
 * A page of the register, keyset-paged: `after` is the position of the last row shown, so a
 * page costs the same at any depth and rows added meanwhile neither repeat nor go missing. One
 * indexed read of asset_summaries; the due-soon and overdue counts, which depend on today, are
 * counted from the stored due dates of the page's rows only.
 */
export async function listRegister(db: Database, projectIds: string[], q: RegisterQuery, today: string) {
  if (!projectIds.length) return { total: 0, rows: [] as RegisterRow[], next: null as string | null };
  const soon = addDays(today, DUE_SOON_DAYS);
  const columns = sortColumns(q.sort);
  const cmp = q.direction === 'asc' ? sql`>` : sql`<`;
  const dir = q.direction === 'asc' ? sql`asc` : sql`desc`;
  const order = sql.join([...columns.map((c) => sql`${c} ${dir}`), sql`s.asset_id ${dir}`], sql`, `);
  let position = sql``;
  if (q.after) {
    const [keys, id] = decodeCursor(q.after, `${q.sort} ${q.direction}`, cursorTypes[q.sort], 'the register');
    const typed = keys.map((k, i) => sql`${k}::${sql.raw(cursorTypes[q.sort][i])}`);
    position = sql`and (${sql.join(columns, sql`, `)}, s.asset_id) ${cmp} (${sql.join(typed, sql`, `)}, ${id}::uuid)`;
  }
  const where = summaryFilter(projectIds, q, today, soon);
  const [page, count] = await Promise.all([
    db.execute(sql`
      select s.asset_id as id, s.project_id, p.code as project_code, s.kind, s.code, s.name, s.issued, s.issued_count, s.worst_margin_pct,
        s.open_remarks, s.open_reviews, s.obligations_done as done,
        (select count(*) from unnest(s.due_dates) d where d >= ${today}::date and d <= ${soon}::date)::int as due_soon,
        (select count(*) from unnest(s.due_dates) d where d < ${today}::date)::int as overdue,
        to_char(s.next_due_on, 'YYYY-MM-DD') as next_due_text, s.rank, s.sort_key
      from (
        select s.*, ${statusRank(today, soon)} as rank, array[${sql.join(columns.map((c) => sql`(${c})::text`), sql`, `)}] as sort_key from asset_summaries s
        where ${where} ${position} order by ${order} limit ${q.pageSize + 1}
      ) s
      join projects p on p.id = s.project_id
      order by ${order}`),
    db.execute(sql`select count(*)::int as total from asset_summaries s where ${where}`),
  ]);
  const raw = page.rows as unknown as RawRow[];
  const more = raw.length > q.pageSize;
  const rows = raw.slice(0, q.pageSize);
  const last = rows[rows.length - 1];
  return { total: (count.rows[0] as { total: number }).total, rows: rows.map(toRow), next: more && last ? encodeCursor(`${q.sort} ${q.direction}`, last.sort_key, last.id) : null };
}

/** Counts per status of every asset of the projects, per project. */
export async function statusCounts(db: Database, projectIds: string[], today: string) {
  if (!projectIds.length) return [];
  const rank = statusRank(today, addDays(today, DUE_SOON_DAYS));
  const res = await db.execute(sql`select s.project_id, ${rank} as rank, count(*)::int as count from asset_summaries s where s.project_id in (${sql.join(projectIds.map((id) => sql`${id}::uuid`), sql`, `)}) group by s.project_id, rank`);
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
