import { and, eq, inArray, isNotNull, lte, sql } from 'drizzle-orm';
import type { AppServices } from '../services';
import { assetObligations, assets, digestSends, memberships, obligationTypes, projects, registerSnapshots, reminderSends, users } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { MAIL_QUEUE } from '../mail/mail-delivery';
import { addDays, dueStage, weekStartOn } from './due-dates';
import { DUE_SOON_DAYS, registerStatuses } from './register-status';
import { digestMessage, reminderMessage, type DueItem } from './register-messages';
import { statusCounts } from './register-query';
import { openReviewSentences } from './review-sentences';

export const REGISTER_DAILY_QUEUE = 'register-daily';
export const REGISTER_WEEKLY_QUEUE = 'register-weekly';

/** Who is reminded of an asset's obligations: the project's designers and approvers (common practice: the people who answer for the studies). */
const RESPONSIBLE = ['designer', 'approver'] as const;

import { todayUtc } from './register-scope';

/**
 * E-mails each reminder that is due on `today` and not yet sent: once when an obligation comes
 * within its reminder window, once when it becomes overdue. The `reminder_sends` row and the
 * mail job commit together, and the row's key (asset, obligation, due date, stage) lets only
 * one of any number of runs, processes or restarts send it. Returns the reminders sent.
 */
export async function sendDueReminders(s: AppServices, today = todayUtc()): Promise<number> {
  // Every candidate is within the longest reminder window; the stage is then judged per type.
  const horizon = addDays(today, 366);
  const candidates = await s.db
    .select({ assetId: assets.id, assetCode: assets.code, assetName: assets.name, projectId: projects.id, projectName: projects.name, typeId: obligationTypes.id, obligation: obligationTypes.name, remindDaysBefore: obligationTypes.remindDaysBefore, dueOn: assetObligations.nextDueOn })
    .from(assetObligations)
    .innerJoin(assets, eq(assets.id, assetObligations.assetId))
    .innerJoin(projects, eq(projects.id, assets.projectId))
    .innerJoin(obligationTypes, eq(obligationTypes.id, assetObligations.obligationTypeId))
    .where(and(isNotNull(assetObligations.nextDueOn), lte(assetObligations.nextDueOn, horizon)));
  let sent = 0;
  for (const c of candidates) {
    const stage = dueStage(c.dueOn, today, c.remindDaysBefore);
    if (stage === 'not-due') continue;
    const did = await inTransaction(s.pool, async (tx, sqlExecutor) => {
      const [claimed] = await tx.insert(reminderSends).values({ assetId: c.assetId, obligationTypeId: c.typeId, dueOn: c.dueOn!, stage }).onConflictDoNothing().returning();
      if (!claimed) return false;
      const people = await tx
        .selectDistinct({ email: users.email })
        .from(memberships)
        .innerJoin(users, eq(users.id, memberships.userId))
        .where(and(eq(memberships.projectId, c.projectId), inArray(memberships.role, [...RESPONSIBLE])));
      const item: DueItem = { projectName: c.projectName, assetCode: c.assetCode, assetName: c.assetName, assetId: c.assetId, obligation: c.obligation, dueOn: c.dueOn! };
      await s.jobs?.enqueue(sqlExecutor, MAIL_QUEUE, people.map((p) => reminderMessage(s.appUrl, stage, item, p.email)));
      return true;
    });
    if (did) sent++;
  }
  return sent;
}

/**
 * One digest per person and ISO week, to everyone who belongs to a project with assets: what is
 * overdue, what falls due within 30 days, and which studies need review. Keyed like the
 * reminders, so a second run in the same week sends nothing.
 */
export async function sendWeeklyDigests(s: AppServices, today = todayUtc()): Promise<number> {
  const week = weekStartOn(today);
  const soon = addDays(today, DUE_SOON_DAYS);
  const people = await s.db
    .selectDistinct({ id: users.id, email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(inArray(memberships.projectId, sql`(select distinct ${assets.projectId} from ${assets})`));
  let sent = 0;
  for (const person of people) {
    const did = await inTransaction(s.pool, async (tx, sqlExecutor) => {
      const [claimed] = await tx.insert(digestSends).values({ userId: person.id, weekStartOn: week }).onConflictDoNothing().returning();
      if (!claimed) return false;
      const projectIds = (await tx.selectDistinct({ id: memberships.projectId }).from(memberships).where(eq(memberships.userId, person.id))).map((p) => p.id);
      const due = await tx
        .select({ projectName: projects.name, assetCode: assets.code, assetName: assets.name, assetId: assets.id, obligation: obligationTypes.name, dueOn: assetObligations.nextDueOn })
        .from(assetObligations)
        .innerJoin(assets, eq(assets.id, assetObligations.assetId))
        .innerJoin(projects, eq(projects.id, assets.projectId))
        .innerJoin(obligationTypes, eq(obligationTypes.id, assetObligations.obligationTypeId))
        .where(and(inArray(assets.projectId, projectIds), isNotNull(assetObligations.nextDueOn), lte(assetObligations.nextDueOn, soon)))
        .orderBy(assetObligations.nextDueOn, assets.code);
      const items = due.map((d) => ({ ...d, dueOn: d.dueOn! }));
      const reviews = await openReviewSentences(tx, projectIds);
      await s.jobs?.enqueue(sqlExecutor, MAIL_QUEUE, [digestMessage(s.appUrl, week, items.filter((d) => d.dueOn < today), items.filter((d) => d.dueOn >= today), reviews, person.email)]);
      return true;
    });
    if (did) sent++;
  }
  return sent;
}

/**
 * Records today's status counts of every project with assets, every status included (zero
 * when none): an upsert, so a second run the same day, or two at once, leaves one row each.
 */
export async function takeRegisterSnapshots(s: AppServices, today = todayUtc()): Promise<void> {
  const projectIds = (await s.db.selectDistinct({ id: assets.projectId }).from(assets)).map((p) => p.id);
  if (!projectIds.length) return;
  const counts = await statusCounts(s.db, projectIds, today);
  const rows = projectIds.flatMap((projectId) =>
    registerStatuses.map((status) => ({ projectId, day: today, status, count: counts.find((c) => c.projectId === projectId && c.status === status)?.count ?? 0 })),
  );
  await s.db
    .insert(registerSnapshots)
    .values(rows)
    .onConflictDoUpdate({ target: [registerSnapshots.projectId, registerSnapshots.day, registerSnapshots.status], set: { count: sql`excluded.count` } });
}

/** The daily job: reminders, then the day's snapshot. */
export async function runRegisterDaily(s: AppServices, today = todayUtc()): Promise<{ reminders: number }> {
  const reminders = await sendDueReminders(s, today);
  await takeRegisterSnapshots(s, today);
  return { reminders };
}
