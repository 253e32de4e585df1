import { integer, jsonb, pgTable, real, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import type { LimitSet } from '../../schemas/limit-set.schema';
import type { ManualItem } from '../../schemas/manual-item.schema';
import { users } from './users';

export const limitSets = pgTable('limit_sets', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull().unique(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

/** Limit sets are versioned: a revision records the version it was checked against. */
export const limitSetVersions = pgTable(
  'limit_set_versions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    limitSetId: uuid('limit_set_id').notNull().references(() => limitSets.id),
    version: integer('version').notNull(),
    limits: jsonb('limits').$type<LimitSet['limits']>().notNull(),
    manualItems: jsonb('manual_items').$type<ManualItem[]>().notNull(),
    /** How far a checker's own value may differ from the computed one, per cent. */
    checkTolerancePct: real('check_tolerance_pct').notNull(),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique().on(t.limitSetId, t.version)],
);
