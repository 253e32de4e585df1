import { jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import type { CableType } from '../../schemas/bonding-study.schema';

/** The catalogue of cable constructions designers copy into their studies. */
export const cableTypes = pgTable('cable_types', {
  id: uuid('id').primaryKey().defaultRandom(),
  code: text('code').notNull().unique(),
  /** Validated by cableTypeSchema; `id` inside equals `code`. */
  data: jsonb('data').$type<CableType>().notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});
