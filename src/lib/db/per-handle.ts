import type { Database } from './client';

/**
 * What `build` makes for a database handle (prepared statements, mostly), made on first use and
 * kept with the handle: Drizzle builds and PostgreSQL parses each statement once per handle.
 */
export function perHandle<T>(build: (db: Database) => T): (db: Database) => T {
  const made = new WeakMap<Database, T>();
  return (db) => {
    let kept = made.get(db);
    if (kept === undefined) made.set(db, (kept = build(db)));
    return kept;
  };
}
