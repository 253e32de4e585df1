import { serverConfig } from '../config.server';
import { createDatabase } from '../db/client';
import { MailQueue } from '../mail/mail-queue';
import type { AppServices } from '../services';

let shared: ReturnType<typeof createDatabase> | undefined;
let started: Promise<AppServices> | undefined;

/** The server process's database handle (no queue needed). */
export function database() {
  shared ??= createDatabase(serverConfig().DATABASE_URL);
  return shared.db;
}

/** Database, pool and mail queue; the first call also starts the mail worker in this process. */
export function services(): Promise<AppServices> {
  started ??= (async () => {
    const cfg = serverConfig();
    database();
    const mail = await MailQueue.start(cfg.DATABASE_URL);
    await mail.work(shared!.db, { host: cfg.SMTP_HOST, port: cfg.SMTP_PORT, from: cfg.MAIL_FROM }, cfg.MAIL_POLL_SECONDS);
    return { db: shared!.db, pool: shared!.pool, mail, appUrl: cfg.APP_URL };
  })();
  return started;
}
