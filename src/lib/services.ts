import type pg from 'pg';
import type { Database } from './db/client';
import type { JobQueue } from './jobs/job-queue';
import type { ObjectStore } from './storage/object-store';

/** What the application services need: the server builds one set, tests and seeds their own. */
export interface AppServices {
  db: Database;
  pool: pg.Pool;
  /** null: queue no jobs, so no e-mail and no record rendering (the demo seed). */
  jobs: JobQueue | null;
  /** null where no file is stored (the demo seed). */
  store: ObjectStore | null;
  appUrl: string;
}
