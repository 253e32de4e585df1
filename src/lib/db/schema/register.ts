import { sql } from 'drizzle-orm';
import { date, doublePrecision, index, integer, jsonb, pgEnum, pgTable, primaryKey, smallint, text, timestamp, unique, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { projects } from './projects';
import { revisions, studies } from './studies';
import { users } from './users';

// The compliance register: the assets a project's studies cover, what each owes (obligations
// with due dates and evidence), the network data of each site, and the studies that data puts
// back in question. Dates without a time are UTC calendar dates ('YYYY-MM-DD').

export const assetKinds = ['circuit', 'site'] as const;
export const assetKindEnum = pgEnum('asset_kind', assetKinds);
export const siteKinds = ['substation', 'link-box-group', 'pipeline', 'fence', 'other'] as const;

export const assets = pgTable(
  'assets',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id').notNull().references(() => projects.id),
    kind: assetKindEnum('kind').notNull(),
    /** Sites only: what kind of place it is. */
    siteKind: text('site_kind', { enum: siteKinds }),
    code: text('code').notNull(),
    name: text('name').notNull(),
    /** Circuits: the route in words (from, to, via). */
    route: text('route').notNull().default(''),
    /** The owner standard whose obligation types this asset owes. */
    ownerStandard: text('owner_standard').notNull(),
    inServiceOn: date('in_service_on', { mode: 'string' }),
    createdBy: uuid('created_by').notNull().references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    /** Set when the asset is taken off the register: its records and audit stay, it owes nothing more. */
    removedAt: timestamp('removed_at', { withTimezone: true }),
    removedBy: uuid('removed_by').references(() => users.id),
  },
  // A removed asset's code may be given to a new one: codes are unique among the assets in the
  // register, whatever their case ("LB-01" and "lb-01" would be read as one asset on site and on paper).
  (t) => [uniqueIndex('assets_project_code_ci_live_idx').on(t.projectId, sql`lower(${t.code})`).where(sql`${t.removedAt} is null`), index('assets_code_idx').on(t.code, t.id)],
);

/**
 * What the register shows of each asset in the register (removed assets have none), kept
 * current in the same transaction as every write to its inputs by database triggers (migration
 * `asset_summary_triggers`), so a page of the register is one indexed read of this table. The
 * status words that depend on today are not stored: `standing` holds the part that does not
 * (no issued study / needs review / the rest), and the rest is read from `next_due_on` against
 * today's date in the query (register-query.ts).
 */
export const assetSummaries = pgTable(
  'asset_summaries',
  {
    assetId: uuid('asset_id').primaryKey().references(() => assets.id, { onDelete: 'cascade' }),
    projectId: uuid('project_id').notNull().references(() => projects.id),
    kind: assetKindEnum('kind').notNull(),
    code: text('code').notNull(),
    name: text('name').notNull(),
    /** Covering issued revisions in words, e.g. "B01 rev 2, B04 rev 1". */
    issued: text('issued').notNull().default(''),
    issuedCount: integer('issued_count').notNull().default(0),
    /** Smallest computed margin of the covering issued revisions (negative: failing). */
    worstMarginPct: doublePrecision('worst_margin_pct'),
    openRemarks: integer('open_remarks').notNull().default(0),
    openReviews: integer('open_reviews').notNull().default(0),
    obligationsDone: integer('obligations_done').notNull().default(0),
    /** Every obligation's next due date, ascending: the page's due-soon and overdue counts. */
    dueDates: date('due_dates', { mode: 'string' }).array().notNull().default(sql`'{}'::date[]`),
    nextDueOn: date('next_due_on', { mode: 'string' }),
    /** 0: no issued study, 1: needs review, 2: covered, due or overdue by next_due_on. */
    standing: smallint('standing').notNull(),
  },
  (t) => [
    index('asset_summaries_code_idx').on(t.projectId, t.code, t.assetId),
    index('asset_summaries_name_idx').on(t.projectId, t.name, t.assetId),
    index('asset_summaries_due_idx').on(t.projectId, sql`coalesce(${t.nextDueOn}, '9999-12-31'::date)`, t.assetId),
    index('asset_summaries_margin_idx').on(t.projectId, sql`coalesce(${t.worstMarginPct}, 1e9::float8)`, t.assetId),
    // The search box (ILIKE '%text%' on code or name): trigram indexes (pg_trgm, migration trigram_extension).
    index('asset_summaries_code_trgm_idx').using('gin', t.code.op('gin_trgm_ops')),
    index('asset_summaries_name_trgm_idx').using('gin', t.name.op('gin_trgm_ops')),
    index('asset_summaries_standing_idx').on(t.projectId, t.standing, sql`coalesce(${t.nextDueOn}, '9999-12-31'::date)`, t.assetId),
  ],
);

/** A study covers an asset; a circuit may be covered by several studies (route sections). */
export const studyAssets = pgTable(
  'study_assets',
  {
    studyId: uuid('study_id').notNull().references(() => studies.id),
    assetId: uuid('asset_id').notNull().references(() => assets.id),
    /** Circuits: the circuit id inside the study's inputs whose load the site data may raise. */
    studyCircuitId: text('study_circuit_id'),
    /** Sites: the route end the site stands at, whose grid resistance it sets (null: either end). */
    siteEnd: text('site_end', { enum: ['start', 'end'] }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.studyId, t.assetId] }), index('study_assets_asset_idx').on(t.assetId)],
);

export interface ObligationCriterion {
  /** What is measured, in words, e.g. "oversheath insulation resistance". */
  quantity: string;
  unit: string;
  /** at-least: every entered value must reach the limit; at-most: none may exceed it. */
  comparison: 'at-least' | 'at-most';
  limit: number;
}

/** What an owner standard requires of its assets, and how often. */
export const obligationTypes = pgTable(
  'obligation_types',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    ownerStandard: text('owner_standard').notNull(),
    name: text('name').notNull(),
    appliesTo: text('applies_to', { enum: ['circuit', 'site', 'both'] }).notNull(),
    firstDueMonths: integer('first_due_months').notNull(),
    /** Null: done once (a commissioning test). */
    intervalMonths: integer('interval_months'),
    criterion: jsonb('criterion').$type<ObligationCriterion>(),
    remindDaysBefore: integer('remind_days_before').notNull().default(30),
    /** Where the interval comes from (clause of the owner's standard), or that it is invented. */
    basis: text('basis').notNull(),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique().on(t.ownerStandard, t.name)],
);

/** Each asset's standing against each obligation it owes: kept with every record, read by the register. */
export const assetObligations = pgTable(
  'asset_obligations',
  {
    assetId: uuid('asset_id').notNull().references(() => assets.id),
    obligationTypeId: uuid('obligation_type_id').notNull().references(() => obligationTypes.id),
    lastDoneOn: date('last_done_on', { mode: 'string' }),
    lastResult: text('last_result', { enum: ['pass', 'fail', 'recorded'] }),
    nextDueOn: date('next_due_on', { mode: 'string' }),
  },
  (t) => [primaryKey({ columns: [t.assetId, t.obligationTypeId] }), index('asset_obligations_due_idx').on(t.nextDueOn)],
);

export const obligationRecords = pgTable(
  'obligation_records',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    assetId: uuid('asset_id').notNull().references(() => assets.id),
    obligationTypeId: uuid('obligation_type_id').notNull().references(() => obligationTypes.id),
    doneOn: date('done_on', { mode: 'string' }).notNull(),
    /** Who did the work (a name: often a contractor without an account). */
    performedBy: text('performed_by').notNull(),
    values: jsonb('values').$type<number[]>().notNull(),
    result: text('result', { enum: ['pass', 'fail', 'recorded'] }).notNull(),
    remarks: text('remarks').notNull().default(''),
    evidenceKey: text('evidence_key'),
    evidenceName: text('evidence_name'),
    evidenceType: text('evidence_type'),
    evidenceBytes: integer('evidence_bytes'),
    evidenceSha256: text('evidence_sha256'),
    recordedBy: uuid('recorded_by').notNull().references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('obligation_records_asset_idx').on(t.assetId, t.doneOn)],
);

export interface SystemData {
  threePhaseFaultKa: number | null;
  earthFaultKa: number | null;
  clearanceTimeS: number | null;
  gridResistanceOhm: number | null;
  /** Largest load per circuit asset, A. */
  maxLoads: Array<{ circuitAssetId: string; maxLoadA: number }>;
}

/** A site's network data, versioned like limit sets: a version never changes once published. */
export const siteSystemData = pgTable(
  'site_system_data',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    siteId: uuid('site_id').notNull().references(() => assets.id),
    version: integer('version').notNull(),
    data: jsonb('data').$type<SystemData>().notNull(),
    source: text('source').notNull(),
    sourceDate: date('source_date', { mode: 'string' }).notNull(),
    publishedBy: uuid('published_by').notNull().references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique().on(t.siteId, t.version)],
);

export interface ReviewReason {
  /** Which figure: earth-fault, three-phase-fault, clearance, grid-resistance, load. */
  kind: string;
  sentence: string;
  /** The inputs field a new revision would change, with the study's value and the new one. */
  path: string;
  before: number;
  after: number;
}

/**
 * An issued revision that a published site data version made non-conservative. It stays open
 * until a later revision of the study is issued.
 */
export const studyReviews = pgTable(
  'study_reviews',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    studyId: uuid('study_id').notNull().references(() => studies.id),
    revisionId: uuid('revision_id').notNull().references(() => revisions.id),
    systemDataId: uuid('system_data_id').notNull().references(() => siteSystemData.id),
    reasons: jsonb('reasons').$type<ReviewReason[]>().notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique().on(t.revisionId, t.systemDataId), index('study_reviews_study_idx').on(t.studyId)],
);

/** One row per reminder sent: the key makes a second send of the same stage impossible, whichever process tries. */
export const reminderSends = pgTable(
  'reminder_sends',
  {
    assetId: uuid('asset_id').notNull().references(() => assets.id),
    obligationTypeId: uuid('obligation_type_id').notNull().references(() => obligationTypes.id),
    dueOn: date('due_on', { mode: 'string' }).notNull(),
    stage: text('stage', { enum: ['due-soon', 'overdue'] }).notNull(),
    sentAt: timestamp('sent_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.assetId, t.obligationTypeId, t.dueOn, t.stage] })],
);

/** One weekly digest per person and ISO week (keyed by its Monday). */
export const digestSends = pgTable(
  'digest_sends',
  {
    userId: uuid('user_id').notNull().references(() => users.id),
    weekStartOn: date('week_start_on', { mode: 'string' }).notNull(),
    sentAt: timestamp('sent_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.weekStartOn] })],
);

/** Status counts per project and day, for the chart of the register over time. */
export const registerSnapshots = pgTable(
  'register_snapshots',
  {
    projectId: uuid('project_id').notNull().references(() => projects.id),
    day: date('day', { mode: 'string' }).notNull(),
    status: text('status').notNull(),
    count: integer('count').notNull(),
  },
  (t) => [primaryKey({ columns: [t.projectId, t.day, t.status] })],
);

export type Asset = typeof assets.$inferSelect;
export type AssetSummary = typeof assetSummaries.$inferSelect;
export type ObligationType = typeof obligationTypes.$inferSelect;
export type ObligationRecord = typeof obligationRecords.$inferSelect;
export type SiteSystemData = typeof siteSystemData.$inferSelect;
export type StudyReview = typeof studyReviews.$inferSelect;
