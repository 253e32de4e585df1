import { sql } from 'drizzle-orm';
import { boolean, check, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './users';

/** How calculation records are put together, set by an administrator: one row for the whole installation. */
export const recordSettings = pgTable(
  'record_settings',
  {
    id: text('id').primaryKey().default('records'),
    /** Append the engine's full validation table to each record (otherwise the record states the summary and links to it). */
    appendValidation: boolean('append_validation').notNull().default(false),
    updatedBy: uuid('updated_by').references(() => users.id),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check('record_settings_one_row', sql`${t.id} = 'records'`)],
);
