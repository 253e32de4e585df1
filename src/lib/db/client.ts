import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Database = NodePgDatabase<typeof schema>;

/**
 * A Drizzle handle on its own pool; scripts and tests make one per database they use.
 * The pool never hangs a caller for ever: a starved pool or an unreachable database fails the
 * acquire after `acquireTimeoutMs` (the server answers 503), and an idle connection that the
 * server drops (a restart, 57P01) is logged and discarded instead of crashing the process.
 */
export function createDatabase(url: string, max = 10, acquireTimeoutMs = 5000): { db: Database; pool: pg.Pool } {
  const pool = new pg.Pool({ connectionString: url, max, connectionTimeoutMillis: acquireTimeoutMs, idleTimeoutMillis: 30_000 });
  pool.on('error', (err) => console.error('[database] idle connection lost:', err.message));
  return { db: drizzle(pool, { schema }), pool };
}
