import { eq } from 'drizzle-orm';
import type { Database } from '../db/client';
import { mailDeliveries } from '../db/schema';
import { type SmtpSettings, createTransport } from './transport';

export const MAIL_QUEUE = 'mail';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

/**
 * The job handler that sends one message over SMTP. A delivered job is recorded, so that a job
 * retried after delivery (for example when completing it failed) never sends twice.
 */
export function mailDelivery(db: Database, smtp: SmtpSettings) {
  const transport = createTransport(smtp);
  return async (jobId: string, mail: OutgoingMail) => {
    const [done] = await db.select().from(mailDeliveries).where(eq(mailDeliveries.jobId, jobId));
    if (done) return;
    // A failure throws: the queue keeps the job and retries it later.
    await transport.sendMail({ from: smtp.from, to: mail.to, subject: mail.subject, text: mail.text });
    await db.insert(mailDeliveries).values({ jobId, recipient: mail.to, subject: mail.subject }).onConflictDoNothing();
  };
}
