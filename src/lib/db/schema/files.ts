import { integer, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { revisions } from './studies';
import { users } from './users';

export const fileKindEnum = pgEnum('file_kind', ['data-sheet', 'drawing', 'measurements', 'other']);
// 'pending' while the bytes go to the object store: a row is written first, so an object never
// exists without one, and a pending row left by a crash is swept with its object.
export const fileStatusEnum = pgEnum('file_status', ['pending', 'stored']);

/** A file attached to a revision; the bytes live in the object store under `storageKey`. */
export const revisionFiles = pgTable('revision_files', {
  id: uuid('id').primaryKey().defaultRandom(),
  revisionId: uuid('revision_id').notNull().references(() => revisions.id),
  kind: fileKindEnum('kind').notNull(),
  fileName: text('file_name').notNull(),
  contentType: text('content_type').notNull(),
  sizeBytes: integer('size_bytes').notNull(),
  sha256: text('sha256').notNull(),
  storageKey: text('storage_key').notNull(),
  status: fileStatusEnum('status').notNull().default('stored'),
  uploadedBy: uuid('uploaded_by').notNull().references(() => users.id),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export type RevisionFile = typeof revisionFiles.$inferSelect;
