import { integer, jsonb, pgTable, text, timestamp, uuid, index } from 'drizzle-orm/pg-core';
import { revisions } from './studies';
import { users } from './users';

/**
 * A design exploration run on a revision's inputs (appraisal, sweep, tornado, placement): the
 * job row while it runs (status, count done) and its result after. Saved runs belong to the
 * revision's evidence and appear in its record; the inputs hash, engine version and parameters
 * (the grid) make them reproducible.
 */
export const explorations = pgTable(
  'explorations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
    kind: text('kind').notNull(),
    params: jsonb('params').notNull(),
    /** running, done, failed, cancelled. */
    status: text('status').notNull().default('running'),
    done: integer('done').notNull().default(0),
    total: integer('total').notNull().default(0),
    inputsHash: text('inputs_hash').notNull(),
    engineVersion: text('engine_version').notNull(),
    limitSetVersionId: uuid('limit_set_version_id'),
    result: jsonb('result'),
    error: text('error'),
    createdBy: uuid('created_by').notNull().references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
    savedBy: uuid('saved_by').references(() => users.id),
    savedAt: timestamp('saved_at', { withTimezone: true }),
  },
  (t) => [index('explorations_revision_idx').on(t.revisionId)],
);

/** The bonding arrangement the designer chose from an appraisal, with the reason; one per revision. */
export const bondingChoices = pgTable('bonding_choices', {
  revisionId: uuid('revision_id').primaryKey().references(() => revisions.id, { onDelete: 'cascade' }),
  explorationId: uuid('exploration_id').notNull().references(() => explorations.id),
  optionKey: text('option_key').notNull(),
  reason: text('reason').notNull(),
  chosenBy: uuid('chosen_by').notNull().references(() => users.id),
  chosenAt: timestamp('chosen_at', { withTimezone: true }).notNull().defaultNow(),
});

export type Exploration = typeof explorations.$inferSelect;
