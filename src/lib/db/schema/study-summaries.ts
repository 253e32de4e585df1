import { index, integer, pgTable, real, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { projects } from './projects';
import { revisionStateEnum, revisions, studies, studyKindEnum } from './studies';

/**
 * One row per study: its latest revision and what the studies table shows of it, the study's
 * code, title and kind included. Kept up to date on write by database triggers (migrations
 * `study_summary_triggers`, `study_summary_list_triggers`), so a page of a project's studies is
 * one indexed range read of one table, however many studies and revisions there are.
 */
export const studySummaries = pgTable(
  'study_summaries',
  {
    studyId: uuid('study_id').primaryKey().references(() => studies.id, { onDelete: 'cascade' }),
    projectId: uuid('project_id').notNull().references(() => projects.id),
    // Copies of the study's own columns, for the list's sorts and filters (the triggers set them).
    code: text('code').notNull().default(''),
    title: text('title').notNull().default(''),
    kind: studyKindEnum('kind').notNull().default('bonding'),
    revisionId: uuid('revision_id').notNull().references(() => revisions.id),
    revisionNumber: integer('revision_number').notNull(),
    state: revisionStateEnum('state').notNull(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull(),
    /** Smallest margin of the latest revision's computed checks (negative: failing). */
    worstMarginPct: real('worst_margin_pct'),
    openRemarks: integer('open_remarks').notNull().default(0),
  },
  // One index per sort, each ending in the study id: a keyset page is a range read of 25 entries.
  (t) => [
    index('study_summaries_project_updated_idx').on(t.projectId, t.updatedAt, t.studyId),
    index('study_summaries_project_code_idx').on(t.projectId, t.code, t.studyId),
    index('study_summaries_project_title_idx').on(t.projectId, t.title, t.studyId),
    index('study_summaries_project_state_idx').on(t.projectId, t.state),
  ],
);
