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

/**
 * An issued revision whose record could not be rendered (a fault in the data or the template,
 * not an outage): the approver is told, the download says why, and a retry clears the row.
 */
export const recordFailures = pgTable('record_failures', {
  revisionId: uuid('revision_id').primaryKey().references(() => revisions.id),
  error: text('error').notNull(),
  failedAt: timestamp('failed_at', { withTimezone: true }).notNull().defaultNow(),
});
