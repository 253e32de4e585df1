import { pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core';

/**
 * What the engine gave for a set of inputs: the hash of its results (in stored, compact form)
 * for an inputs hash and engine version. A hand-off that finds its inputs here compares the
 * stored results with this hash instead of calculating again; only a fresh calculation writes it.
 */
export const recomputations = pgTable(
  'recomputations',
  {
    inputsHash: text('inputs_hash').notNull(),
    engineVersion: text('engine_version').notNull(),
    resultsHash: text('results_hash').notNull(),
    computedAt: timestamp('computed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.inputsHash, t.engineVersion] })],
);
