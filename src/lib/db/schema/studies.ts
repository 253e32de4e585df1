import { sql } from 'drizzle-orm';
import { boolean, index, integer, jsonb, pgEnum, pgTable, real, text, timestamp, unique, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { projects } from './projects';
import { users } from './users';
import { limitSetVersions, limitSets } from './limit-sets';
import { revisionStates } from '../../workflow/revision.machine';

export const studyKindEnum = pgEnum('study_kind', ['bonding', 'exposure']);
export const revisionStateEnum = pgEnum('revision_state', revisionStates);

export const studies = pgTable(
  'studies',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id').notNull().references(() => projects.id),
    code: text('code').notNull(),
    title: text('title').notNull(),
    kind: studyKindEnum('kind').notNull(),
    limitSetId: uuid('limit_set_id').notNull().references(() => limitSets.id),
    createdBy: uuid('created_by').notNull().references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique().on(t.projectId, t.code)],
);

export const revisions = pgTable(
  'revisions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    studyId: uuid('study_id').notNull().references(() => studies.id),
    number: integer('number').notNull(),
    state: revisionStateEnum('state').notNull().default('draft'),
    machineVersion: integer('machine_version').notNull(),
    /** Optimistic concurrency: every change increments it; a stale write is refused. */
    version: integer('version').notNull().default(1),
    inputs: jsonb('inputs').notNull(),
    inputsHash: text('inputs_hash').notNull(),
    results: jsonb('results'),
    /**
     * PostgreSQL's 64-bit hash of `results` (jsonb_hash_extended, seed 0) as a calculation wrote
     * them: a recalculation with nothing changed proves the figures untouched without printing
     * them. Written only by calculateRevision, never by a trigger.
     */
    resultsCheck: text('results_check'),
    resultsInputsHash: text('results_inputs_hash'),
    engineVersion: text('engine_version'),
    limitSetVersionId: uuid('limit_set_version_id').references(() => limitSetVersions.id),
    designerId: uuid('designer_id').notNull().references(() => users.id),
    checkerId: uuid('checker_id').references(() => users.id),
    approverId: uuid('approver_id').references(() => users.id),
    basedOnId: uuid('based_on_id').references((): AnyPgColumn => revisions.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    issuedAt: timestamp('issued_at', { withTimezone: true }),
  },
  (t) => [
    unique().on(t.studyId, t.number),
    // The home page's queues (longest waiting first) and recent activity, at any number of studies.
    index('revisions_designer_waiting_idx').on(t.designerId, t.updatedAt, t.id).where(sql`${t.state} in ('draft', 'returned')`),
    index('revisions_in_review_idx').on(t.updatedAt, t.id).where(sql`${t.state} in ('ready_for_check', 'in_check', 'checked')`),
    index('revisions_updated_at_idx').on(t.updatedAt),
  ],
);

export const checklistKindEnum = pgEnum('checklist_kind', ['computed', 'manual']);

export const checklistItems = pgTable(
  'checklist_items',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
    itemKey: text('item_key').notNull(),
    kind: checklistKindEnum('kind').notNull(),
    title: text('title').notNull(),
    /** computed: pass / fail / no-limit; manual: open until answered. */
    status: text('status').notNull(),
    value: real('value'),
    limitValue: real('limit_value'),
    unit: text('unit').notNull().default(''),
    marginPct: real('margin_pct'),
    caseId: text('case_id'),
    location: text('location'),
    source: text('source').notNull(),
    answer: text('answer'),
    answerReason: text('answer_reason'),
    answeredBy: uuid('answered_by').references(() => users.id),
    /** The study itself answered "not applicable": the question's subject is absent from its inputs. */
    answerGenerated: boolean('answer_generated').notNull().default(false),
    checkerVerdict: text('checker_verdict'),
    justification: text('justification'),
    justifiedBy: uuid('justified_by').references(() => users.id),
    /** Why the designer submits a failing computed item (shown to the checker and the approver). */
    designerJustification: text('designer_justification'),
    designerJustifiedBy: uuid('designer_justified_by').references(() => users.id),
    sortOrder: integer('sort_order').notNull(),
  },
  (t) => [unique().on(t.revisionId, t.itemKey)],
);

export const remarks = pgTable('remarks', {
  id: uuid('id').primaryKey().defaultRandom(),
  revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
  parentId: uuid('parent_id').references((): AnyPgColumn => remarks.id),
  authorId: uuid('author_id').notNull().references(() => users.id),
  /** What the remark is about: a checklist item key or an input field path. */
  itemKey: text('item_key'),
  field: text('field'),
  /** A thread's first remark: 'remark', 'query' (raised on a checklist item) or 'return' (the reason a revision went back). Replies: 'reply'. */
  kind: text('kind').notNull().default('remark'),
  body: text('body').notNull(),
  /** On a thread's first remark: the thread is closed. Always true on a reply, so unresolved rows are exactly the open threads. */
  resolved: boolean('resolved').notNull().default(false),
  closedBy: uuid('closed_by').references(() => users.id),
  closedAt: timestamp('closed_at', { withTimezone: true }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const checkValues = pgTable('check_values', {
  id: uuid('id').primaryKey().defaultRandom(),
  revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
  checkerId: uuid('checker_id').notNull().references(() => users.id),
  /** Which result the checker derived independently: a checklist item key. */
  itemKey: text('item_key').notNull(),
  checkerValue: real('checker_value').notNull(),
  computedValue: real('computed_value').notNull(),
  deviationPct: real('deviation_pct').notNull(),
  tolerancePct: real('tolerance_pct').notNull(),
  explanation: text('explanation'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }),
});

export const signOffRoleEnum = pgEnum('sign_off_role', ['designer', 'checker', 'approver']);

export const signOffs = pgTable('sign_offs', {
  id: uuid('id').primaryKey().defaultRandom(),
  revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
  userId: uuid('user_id').notNull().references(() => users.id),
  role: signOffRoleEnum('role').notNull(),
  statement: text('statement').notNull(),
  /** What the signature covers: the revision's inputs hash and the SHA-256 of its canonical results, at signing. Null only on rows signed before this was recorded. */
  inputsHash: text('inputs_hash'),
  resultsHash: text('results_hash'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export type Study = typeof studies.$inferSelect;
export type Revision = typeof revisions.$inferSelect;
export type ChecklistRow = typeof checklistItems.$inferSelect;
export type Remark = typeof remarks.$inferSelect;
export type CheckValue = typeof checkValues.$inferSelect;
export type SignOff = typeof signOffs.$inferSelect;
