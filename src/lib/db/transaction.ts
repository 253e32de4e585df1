import { drizzle } from 'drizzle-orm/node-postgres';
import type pg from 'pg';
import type { Database } from './client';

/** Runs raw SQL on the transaction's connection (for pg-boss, so jobs commit with the change). */
export interface SqlExecutor {
  executeSql(text: string, values: unknown[]): Promise<{ rows: unknown[] }>;
}

/**
 * One database transaction on one pooled connection, shared by Drizzle and by raw SQL (the job
 * queue): either everything the callback wrote commits, or none of it does.
 */
export async function inTransaction<T>(pool: pg.Pool, work: (tx: Database, sqlExecutor: SqlExecutor) => Promise<T>): Promise<T> {
  const client = await pool.connect();
  // A connection lost mid-transaction (a database restart) emits 'error' on the checked-out
  // client; without a listener that would end the process. The failing query rejects anyway.
  let lost: Error | undefined;
  const onError = (err: Error) => (lost = err);
  client.on('error', onError);
  try {
    await client.query('begin');
    // Without the schema: nothing uses relational queries, and extracting their configuration
    // from every table on each transaction was a measurable share of a calculation's CPU.
    const tx = drizzle(client) as unknown as Database;
    const result = await work(tx, { executeSql: (text, values) => client.query(text, values as unknown[]) });
    await client.query('commit');
    return result;
  } catch (err) {
    await client.query('rollback').catch((e: Error) => (lost ??= e));
    throw err;
  } finally {
    client.off('error', onError);
    // A broken connection is destroyed, not returned to the pool.
    client.release(lost);
  }
}
