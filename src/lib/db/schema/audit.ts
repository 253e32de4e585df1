import { bigserial, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/** Append-only: each event carries the hash of the one before it, so a changed row breaks the chain. */
export const auditEvents = pgTable('audit_events', {
  id: bigserial('id', { mode: 'number' }).primaryKey(),
  at: timestamp('at', { withTimezone: true, mode: 'date', precision: 3 }).notNull(),
  actorId: uuid('actor_id'),
  type: text('type').notNull(),
  projectId: uuid('project_id'),
  studyId: uuid('study_id'),
  revisionId: uuid('revision_id'),
  detail: jsonb('detail').notNull(),
  prevHash: text('prev_hash').notNull(),
  hash: text('hash').notNull(),
});

export type AuditEvent = typeof auditEvents.$inferSelect;
