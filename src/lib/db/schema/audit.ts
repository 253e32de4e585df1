import { sql } from 'drizzle-orm';
import { bigint, bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

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
}, (t) => [
  // A revision's history, and the record's, read its own events among hundreds of thousands.
  index('audit_events_revision_idx').on(t.revisionId, t.id),
  // An auditor's scope (audit-scope.ts): their projects' events, and the shared reference data's by type prefix.
  index('audit_events_project_idx').on(t.projectId, t.id),
  index('audit_events_shared_type_idx').on(t.type.op('text_pattern_ops')).where(sql`${t.projectId} is null`),
]);

export type AuditEvent = typeof auditEvents.$inferSelect;

/**
 * Where a verification of the whole chain got to: the last event found intact and its hash. An
 * incremental verification starts after the latest checkpoint (after checking that this event
 * still carries the hash); a full one walks from the first event and finds a change anywhere.
 */
export const auditCheckpoints = pgTable('audit_checkpoints', {
  id: bigserial('id', { mode: 'number' }).primaryKey(),
  eventId: bigint('event_id', { mode: 'number' }).notNull(),
  hash: text('hash').notNull(),
  /** 'full' (walked from the first event) or 'incremental' (from the checkpoint before). */
  mode: text('mode').notNull(),
  verifiedAt: timestamp('verified_at', { withTimezone: true }).notNull().defaultNow(),
});
