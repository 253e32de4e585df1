import type pg from 'pg';
import type { Database } from './db/client';
import type { MailQueue } from './mail/mail-queue';

/** What the application services need: the server builds one set, tests and seeds their own. */
export interface AppServices {
  db: Database;
  pool: pg.Pool;
  /** null: queue no e-mail (the demo seed). */
  mail: MailQueue | null;
  appUrl: string;
}
