import { sql } from 'drizzle-orm';
import { LRUCache } from 'lru-cache';
import type { Database } from './client';

/**
 * Answers kept until the data they were read from may have changed.
 *
 * The stamp is the database's current snapshot (`pg_current_snapshot()`), which decides what a
 * statement sees. Its upper bound moves past every transaction that writes and then ends, and its
 * list of transactions in progress only shrinks below that bound, so the stamp never returns to a
 * value it has left: while it stands, no write has been committed, and statements see the same rows
 * (a writer still in progress changes nothing a reader sees until it ends, and its end moves the
 * stamp). Reads alone leave it as it is. So an answer computed after its stamp was read is still
 * the answer while the stamp stands, whichever server process or path wrote. The stamp is coarse
 * (a write anywhere starts every answer afresh) but writers keep nothing for it: it suits screens
 * read far more often than anything is written, such as the home page queues and the audit trail.
 */
const STAMP = sql`select pg_current_snapshot()::text as stamp`;

export async function snapshotStamp(db: Database): Promise<string> {
  const { rows } = await db.execute<{ stamp: string }>(STAMP);
  return rows[0].stamp;
}

interface Kept<V> {
  readonly stamp: string;
  readonly answer: Promise<V>;
  /** The answer's size as JSON text, once it is known (1 until then). */
  readonly size: number;
}

/**
 * A cache of answers by key, each valid under the snapshot stamp read before it was computed,
 * bounded by the answers' total size as JSON text. Concurrent requests for the same key and
 * stamp share one computation; a failed one is not kept. Callers must not change what they are
 * given: it is shared. Pass the pool's handle, never a transaction's: inside a transaction the
 * snapshot leaves out the transaction's own writes.
 */
export function snapshotCache<V extends object>(maxBytes: number) {
  const answers = new LRUCache<string, Kept<V>>({ maxSize: maxBytes, sizeCalculation: (kept) => kept.size });
  return async function cached(db: Database, key: string, compute: () => Promise<V>): Promise<V> {
    const stamp = await snapshotStamp(db);
    const found = answers.get(key);
    if (found?.stamp === stamp) return found.answer;
    const kept: Kept<V> = { stamp, answer: compute(), size: 1 };
    answers.set(key, kept);
    kept.answer.then(
      (value) => {
        // Sized once known, as a new entry (the cache sizes an entry when it is set); one larger than the whole cache is dropped.
        if (answers.peek(key) === kept) answers.set(key, { ...kept, size: Math.max(1, JSON.stringify(value).length) });
      },
      () => {
        if (answers.peek(key) === kept) answers.delete(key);
      },
    );
    return kept.answer;
  };
}
