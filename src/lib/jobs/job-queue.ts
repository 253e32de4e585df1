import PgBoss from 'pg-boss';
import type { SqlExecutor } from '../db/transaction';

export interface RetryPolicy {
  retryLimit: number;
  retryDelay: number;
  retryBackoff: boolean;
}

// Enough attempts to ride out an outage of several hours with back-off.
const DEFAULT_RETRY: RetryPolicy = { retryLimit: 30, retryDelay: 10, retryBackoff: true };

/**
 * Background jobs in PostgreSQL (pg-boss): queued on the caller's transaction, so a job exists
 * only if the change that caused it committed, and retried until its handler succeeds.
 */
/** Jobs a worker takes at a time. */
const WORK_BATCH = 5;

export class JobQueue {
  private constructor(
    private readonly boss: PgBoss,
    private readonly retry: RetryPolicy,
  ) {}

  static async start(databaseUrl: string, queues: string[], retry: RetryPolicy = DEFAULT_RETRY): Promise<JobQueue> {
    const boss = new PgBoss({ connectionString: databaseUrl, max: 3, schema: 'pgboss' });
    boss.on('error', (err) => console.error('[jobs]', err.message));
    await boss.start();
    for (const q of queues) await boss.createQueue(q);
    return new JobQueue(boss, retry);
  }

  /** `expireInSeconds`: how long a started job may run before it counts as failed and is retried. */
  async enqueue(tx: SqlExecutor, queue: string, payloads: object[], options: { expireInSeconds?: number } = {}): Promise<void> {
    for (const payload of payloads) await this.boss.send(queue, payload, { ...this.retry, ...options, db: tx as PgBoss.Db });
  }

  /**
   * A job sent on a cron schedule (UTC). pg-boss keeps schedules in the database and sends
   * each scheduled job once, whichever of several processes notices the time first.
   */
  async schedule(queue: string, cron: string, payload: object = {}): Promise<void> {
    await this.boss.schedule(queue, cron, payload, { ...this.retry, tz: 'UTC' });
  }

  /** A job outside any transaction (a catch-up run at start). */
  async sendNow(queue: string, payload: object = {}, options: { singletonKey?: string } = {}): Promise<void> {
    await this.boss.send(queue, payload, { ...this.retry, ...options });
  }

  /** Runs `handle` for each job of a queue; a handler that throws leaves the job to be retried. */
  async work<T extends object>(queue: string, handle: (jobId: string, data: T) => Promise<void>, pollingIntervalSeconds = 1): Promise<void> {
    let workerId: string | undefined;
    workerId = await this.boss.work<T>(queue, { pollingIntervalSeconds, batchSize: WORK_BATCH }, async (jobs) => {
      for (const job of jobs) await handle(job.id, job.data);
      // A full batch means more may be waiting: fetch again at once, not after the polling
      // interval, or a burst (fifty remarks, each with its e-mail) drains at five per interval.
      if (jobs.length === WORK_BATCH && workerId) this.boss.notifyWorker(workerId);
    });
  }

  async stop(): Promise<void> {
    await this.boss.stop({ graceful: true, timeout: 5000, wait: true });
  }
}
