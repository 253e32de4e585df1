import { customType, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { revisions } from './studies';

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' });

/** The issued record of a revision: rendered once, then served byte for byte. */
export const issuedRecords = pgTable('issued_records', {
  revisionId: uuid('revision_id').primaryKey().references(() => revisions.id),
  document: bytea('document').notNull(),
  sha256: text('sha256').notNull(),
  sizeBytes: integer('size_bytes').notNull(),
  renderedAt: timestamp('rendered_at', { withTimezone: true }).notNull().defaultNow(),
});
