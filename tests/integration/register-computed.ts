import { sql } from 'drizzle-orm';
import type { Database } from '../../src/lib/db/client';
import { addDays } from '../../src/lib/register/due-dates';
import { DUE_SOON_DAYS, registerStatus } from '../../src/lib/register/register-status';

// The register as it was read before asset_summaries: every figure computed from the source
// tables at read time (lateral look-ups per asset), and the status from registerStatus() itself
// rather than from SQL. Kept here as the reference the summary table must agree with.

export interface ComputedRow {
  id: string;
  projectId: string;
  kind: string;
  code: string;
  name: string;
  issued: string;
  issuedCount: number;
  worstMarginPct: number | null;
  openRemarks: number;
  openReviews: number;
  done: number;
  dueSoon: number;
  overdue: number;
  nextDueOn: string | null;
  status: string;
}

/** Every asset of the projects still in the register, computed from scratch, by id. */
export async function computedRegister(db: Database, projectIds: string[], today: string): Promise<Map<string, ComputedRow>> {
  const soon = addDays(today, DUE_SOON_DAYS);
  const res = await db.execute(sql`
    select a.id, a.project_id, a.kind, a.code, a.name,
      coalesce(iss.issued, '') as issued, coalesce(iss.issued_count, 0) as issued_count, iss.worst_margin_pct,
      coalesce(rem.open_remarks, 0) as open_remarks, coalesce(rev.open_reviews, 0) as open_reviews,
      coalesce(ob.done, 0) as done, coalesce(ob.due_soon, 0) as due_soon, coalesce(ob.overdue, 0) as overdue, to_char(ob.next_due_on, 'YYYY-MM-DD') as next_due_text
    from assets a
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
    where a.project_id in (${sql.join(projectIds.map((id) => sql`${id}::uuid`), sql`, `)}) and a.removed_at is null`);
  const rows = res.rows as Array<Record<string, unknown>>;
  return new Map(
    rows.map((r) => {
      const row: ComputedRow = {
        id: r.id as string,
        projectId: r.project_id as string,
        kind: r.kind as string,
        code: r.code as string,
        name: r.name as string,
        issued: r.issued as string,
        issuedCount: r.issued_count as number,
        worstMarginPct: r.worst_margin_pct === null ? null : Number(r.worst_margin_pct),
        openRemarks: r.open_remarks as number,
        openReviews: r.open_reviews as number,
        done: r.done as number,
        dueSoon: r.due_soon as number,
        overdue: r.overdue as number,
        nextDueOn: r.next_due_text as string | null,
        status: registerStatus({ issuedStudies: r.issued_count as number, openReviews: r.open_reviews as number, overdue: r.overdue as number, dueSoon: r.due_soon as number }),
      };
      return [row.id, row];
    }),
  );
}
