import { boolean, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './users';

export const invitations = pgTable('invitations', {
  id: uuid('id').primaryKey().defaultRandom(),
  email: text('email').notNull(),
  name: text('name').notNull(),
  isAdmin: boolean('is_admin').notNull().default(false),
  /** SHA-256 of the token in the link; the token itself is only ever in the e-mail. */
  tokenHash: text('token_hash').notNull().unique(),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  usedAt: timestamp('used_at', { withTimezone: true }),
  invitedBy: uuid('invited_by').notNull().references(() => users.id),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

/** One row per delivered job, so a retried job never sends its message twice. */
export const mailDeliveries = pgTable('mail_deliveries', {
  jobId: text('job_id').primaryKey(),
  recipient: text('recipient').notNull(),
  subject: text('subject').notNull(),
  deliveredAt: timestamp('delivered_at', { withTimezone: true }).notNull().defaultNow(),
});
