import type pg from 'pg';
import type { Database } from './db/client';
import type { JobQueue } from './jobs/job-queue';

/** What the application services need: the server builds one set, tests and seeds their own. */
export interface AppServices {
  db: Database;
  pool: pg.Pool;
  /** null: queue no jobs, so no e-mail and no record rendering (the demo seed). */
  jobs: JobQueue | null;
  appUrl: string;
}
