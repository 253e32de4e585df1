import { serverConfig } from '../config.server';
import { createDatabase } from '../db/client';
import { JobQueue } from '../jobs/job-queue';
import { ObjectStore } from '../storage/object-store';
import { sweepPendingUploads } from '../files/files.service';
import { MAIL_QUEUE, mailDelivery } from '../mail/mail-delivery';
import { RECORD_QUEUE, resumeIssuedRecords, storeIssuedRecord } from '../records/records.service';
import type { AppServices } from '../services';
import { REGISTER_DAILY_QUEUE, REGISTER_WEEKLY_QUEUE, runRegisterDaily, sendWeeklyDigests } from '../register/reminders.service';

const SWEEP_INTERVAL_MS = 15 * 60 * 1000;

let shared: ReturnType<typeof createDatabase> | undefined;
let started: Promise<AppServices> | undefined;

/** The server process's database handle (no queue needed). */
export function database() {
  shared ??= createDatabase(serverConfig().DATABASE_URL);
  return shared.db;
}

/**
 * Database, pool and job queue; the first call also starts the job workers in this process.
 * A start that fails (the database is down) is forgotten, so the next request tries again and
 * the server recovers by itself when the database returns.
 */
export function services(): Promise<AppServices> {
  started ??= (async () => {
    const cfg = serverConfig();
    database();
    const jobs = await JobQueue.start(cfg.DATABASE_URL, [MAIL_QUEUE, RECORD_QUEUE, REGISTER_DAILY_QUEUE, REGISTER_WEEKLY_QUEUE]);
    await jobs.work(MAIL_QUEUE, mailDelivery(shared!.db, { host: cfg.SMTP_HOST, port: cfg.SMTP_PORT, from: cfg.MAIL_FROM }), cfg.MAIL_POLL_SECONDS);
    const store = new ObjectStore({ endpoint: cfg.S3_ENDPOINT, bucket: cfg.S3_BUCKET, region: cfg.S3_REGION, accessKeyId: cfg.S3_ACCESS_KEY, secretAccessKey: cfg.S3_SECRET_KEY });
    const s: AppServices = { db: shared!.db, pool: shared!.pool, jobs, store, appUrl: cfg.APP_URL };
    await jobs.work<{ revisionId: string }>(RECORD_QUEUE, (_id, job) => storeIssuedRecord(s, job.revisionId), cfg.MAIL_POLL_SECONDS);
    await jobs.work(REGISTER_DAILY_QUEUE, async () => void (await runRegisterDaily(s)), cfg.MAIL_POLL_SECONDS);
    await jobs.work(REGISTER_WEEKLY_QUEUE, async () => void (await sendWeeklyDigests(s)), cfg.MAIL_POLL_SECONDS);
    // Reminders each morning and the digest on Mondays (UTC). A server that was down at the
    // scheduled time catches up on the day's reminders when it starts; each reminder and
    // digest is keyed in the database, so a catch-up never sends one twice.
    await jobs.schedule(REGISTER_DAILY_QUEUE, '0 6 * * *');
    await jobs.schedule(REGISTER_WEEKLY_QUEUE, '0 7 * * 1');
    await jobs.sendNow(REGISTER_DAILY_QUEUE, {}, { singletonKey: `catch-up-${new Date().toISOString().slice(0, 10)}` });
    const resumed = await resumeIssuedRecords(s);
    if (resumed) console.log(`[records] resumed ${resumed} issued record(s) left unrendered`);
    const sweep = () => sweepPendingUploads(s).catch((err) => console.error('[files] sweeping pending uploads failed:', err.message));
    void sweep();
    setInterval(sweep, SWEEP_INTERVAL_MS).unref();
    return s;
  })();
  const attempt = started;
  attempt.catch(() => {
    if (started === attempt) started = undefined;
  });
  return attempt;
}
