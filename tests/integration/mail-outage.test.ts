import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { type AddressInfo, createServer } from 'node:net';
import { MailDev } from 'maildev';
import { createDatabase } from '../../src/lib/db/client';
import { migrateDatabase } from '../../src/lib/db/migrate';
import { JobQueue } from '../../src/lib/jobs/job-queue';
import { MAIL_QUEUE, mailDelivery } from '../../src/lib/mail/mail-delivery';
import { inTransaction } from '../../src/lib/db/transaction';
import { testEnv } from '../helpers/env';
import { caughtMail, waitForMail } from '../helpers/maildev-client';

// The real queue (pg-boss on PostgreSQL) and the real SMTP catcher, in a database of its own so
// that the server's worker does not take these jobs. The SMTP server is down when the message
// is queued and comes back later.

// Ports of this test's own catcher: free ones, never the suite's (which any port settings may move).
let SMTP_PORT = 0;
let WEB_PORT = 0;
const name = `mail_outage_${process.pid}`;

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer().listen(0, '127.0.0.1', () => {
      const { port } = server.address() as AddressInfo;
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

async function startMaildev(): Promise<{ close: () => Promise<void> }> {
  const maildev = new MailDev({ smtp: SMTP_PORT, web: WEB_PORT, ip: '127.0.0.1', webIp: '127.0.0.1', silent: true });
  await maildev.start();
  return { close: () => maildev.stop() };
}

describe('e-mail survives an SMTP outage', () => {
  const admin = new pg.Client({ connectionString: testEnv().databaseUrl });
  let url: string;
  let queue: JobQueue;
  let handle: ReturnType<typeof createDatabase>;

  beforeAll(async () => {
    [SMTP_PORT, WEB_PORT] = [await freePort(), await freePort()];
    await admin.connect();
    await admin.query(`drop database if exists ${name} with (force)`);
    await admin.query(`create database ${name}`);
    const u = new URL(testEnv().databaseUrl);
    u.pathname = `/${name}`;
    url = u.toString();
    handle = createDatabase(url, 3);
    await migrateDatabase(handle.db);
    queue = await JobQueue.start(url, [MAIL_QUEUE], { retryLimit: 20, retryDelay: 1, retryBackoff: false });
  });

  afterAll(async () => {
    await queue?.stop();
    await handle?.pool.end();
    // Dropping with force would kill connections that are still closing and surface as errors.
    for (let i = 0; i < 50; i++) {
      const { rows } = await admin.query('select count(*)::int as n from pg_stat_activity where datname = $1', [name]);
      if (rows[0].n === 0) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    await admin.query(`drop database if exists ${name}`);
    await admin.end();
  });

  it('queues while SMTP is down, delivers once when it returns', async () => {
    await queue.work(MAIL_QUEUE, mailDelivery(handle.db, { host: '127.0.0.1', port: SMTP_PORT, from: 'Sheathwise <test@sheathwise.invalid>' }), 0.5);
    await inTransaction(handle.pool, (_tx, sqlExecutor) =>
      queue.enqueue(sqlExecutor, MAIL_QUEUE, [{ to: 'checker@sheathwise.example', subject: 'outage probe', text: 'sent while SMTP was down' }]),
    );
    // Wait until the worker has tried and failed against the closed port (polled: a busy
    // machine may take longer than an idle one to get there).
    let retries = 0;
    for (let waited = 0; waited < 20_000 && retries < 1; waited += 250) {
      await new Promise((r) => setTimeout(r, 250));
      const { rows } = await handle.pool.query(`select retry_count from pgboss.job where name = 'mail'`);
      retries = rows[0]?.retry_count ?? 0;
    }
    expect(retries).toBeGreaterThanOrEqual(1);

    const maildev = await startMaildev();
    try {
      const web = `http://127.0.0.1:${WEB_PORT}`;
      await waitForMail(web, (m) => m.some((x) => x.subject === 'outage probe'));
      await new Promise((r) => setTimeout(r, 3000)); // time for any duplicate to show up
      expect((await caughtMail(web)).filter((m) => m.subject === 'outage probe')).toHaveLength(1);
    } finally {
      await maildev.close();
    }
  });

  it('queues nothing when the transaction that would send it rolls back', async () => {
    await expect(
      inTransaction(handle.pool, async (_tx, sqlExecutor) => {
        await queue.enqueue(sqlExecutor, MAIL_QUEUE, [{ to: 'a@sheathwise.example', subject: 'rolled back', text: 'never' }]);
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    const { rows } = await handle.pool.query(`select count(*)::int as n from pgboss.job where data->>'subject' = 'rolled back'`);
    expect(rows[0].n).toBe(0);
  });
});
