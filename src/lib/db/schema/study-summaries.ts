import { index, integer, pgTable, real, timestamp, uuid } from 'drizzle-orm/pg-core';
import { projects } from './projects';
import { revisionStateEnum, revisions, studies } from './studies';

/**
 * One row per study: its latest revision and what the studies table shows of it. Kept up to
 * date on write by database triggers (migration `study_summary_triggers`), so a page of a
 * project's studies is one indexed read however many studies and revisions there are.
 */
export const studySummaries = pgTable(
  'study_summaries',
  {
    studyId: uuid('study_id').primaryKey().references(() => studies.id, { onDelete: 'cascade' }),
    projectId: uuid('project_id').notNull().references(() => projects.id),
    revisionId: uuid('revision_id').notNull().references(() => revisions.id),
    revisionNumber: integer('revision_number').notNull(),
    state: revisionStateEnum('state').notNull(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull(),
    /** Smallest margin of the latest revision's computed checks (negative: failing). */
    worstMarginPct: real('worst_margin_pct'),
    openRemarks: integer('open_remarks').notNull().default(0),
  },
  (t) => [index('study_summaries_project_updated_idx').on(t.projectId, t.updatedAt, t.studyId), index('study_summaries_project_state_idx').on(t.projectId, t.state)],
);
