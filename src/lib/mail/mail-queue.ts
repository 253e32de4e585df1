import PgBoss from 'pg-boss';
import { eq } from 'drizzle-orm';
import type { Database } from '../db/client';
import { mailDeliveries } from '../db/schema';
import type { SqlExecutor } from '../db/transaction';
import { type SmtpSettings, createTransport } from './transport';

export const MAIL_QUEUE = 'mail';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

export interface RetryPolicy {
  retryLimit: number;
  retryDelay: number;
  retryBackoff: boolean;
}

// Enough attempts to ride out an SMTP outage of several hours with back-off.
const DEFAULT_RETRY: RetryPolicy = { retryLimit: 30, retryDelay: 10, retryBackoff: true };

/**
 * Outgoing e-mail as jobs in PostgreSQL (pg-boss). A message is queued in the same transaction
 * as the change it reports, retried while the SMTP server is down, and recorded once delivered
 * so that a retried job never sends it twice.
 */
export class MailQueue {
  private constructor(
    private readonly boss: PgBoss,
    private readonly retry: RetryPolicy,
  ) {}

  static async start(databaseUrl: string, retry: RetryPolicy = DEFAULT_RETRY): Promise<MailQueue> {
    const boss = new PgBoss({ connectionString: databaseUrl, max: 3, schema: 'pgboss' });
    boss.on('error', (err) => console.error('[mail queue]', err.message));
    await boss.start();
    await boss.createQueue(MAIL_QUEUE);
    return new MailQueue(boss, retry);
  }

  /** Queues messages on the caller's transaction: they are sent only if it commits. */
  async enqueue(tx: SqlExecutor, messages: OutgoingMail[]): Promise<void> {
    for (const message of messages) {
      await this.boss.send(MAIL_QUEUE, message, { ...this.retry, db: tx as PgBoss.Db });
    }
  }

  /** Starts delivering queued messages through SMTP. */
  async work(db: Database, smtp: SmtpSettings, pollingIntervalSeconds = 1): Promise<void> {
    const transport = createTransport(smtp);
    await this.boss.work<OutgoingMail>(MAIL_QUEUE, { pollingIntervalSeconds, batchSize: 5 }, async (jobs) => {
      for (const job of jobs) await deliver(db, transport, smtp.from, job.id, job.data);
    });
  }

  async stop(): Promise<void> {
    await this.boss.stop({ graceful: true, timeout: 5000, wait: true });
  }
}

async function deliver(db: Database, transport: ReturnType<typeof createTransport>, from: string, jobId: string, mail: OutgoingMail) {
  const [done] = await db.select().from(mailDeliveries).where(eq(mailDeliveries.jobId, jobId));
  if (done) return;
  // A failure throws: pg-boss keeps the job and retries it later.
  await transport.sendMail({ from, to: mail.to, subject: mail.subject, text: mail.text });
  await db.insert(mailDeliveries).values({ jobId, recipient: mail.to, subject: mail.subject }).onConflictDoNothing();
}
