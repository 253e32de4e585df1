import net from 'node:net';
import { sql } from 'drizzle-orm';
import type { Database } from '../db/client';

export interface HealthReport {
  ok: boolean;
  database: { ok: boolean; detail?: string };
  mail: { ok: boolean; detail?: string };
}

// Probes in flight are shared: twenty health requests at once cost one query, not twenty. The
// SMTP answer is remembered for a few seconds: a mail server may wait for a reverse DNS lookup
// before its greeting (about 100 ms here), which would make every health answer that slow.
const SMTP_REMEMBERED_MS = 5000;
type Probe = HealthReport['database'];
let databaseInFlight: Promise<Probe> | null = null;
let smtpInFlight: Promise<Probe> | null = null;
let smtpKnown: { at: number; result: Probe } | null = null;

/** Answers whether the database takes a query and the SMTP server greets, each within 2 s. */
export async function checkHealth(db: Database, smtp: { host: string; port: number }): Promise<HealthReport> {
  const database = (databaseInFlight ??= probeDatabase(db).finally(() => (databaseInFlight = null)));
  const fresh = smtpKnown && Date.now() - smtpKnown.at < SMTP_REMEMBERED_MS ? smtpKnown.result : null;
  const mail =
    fresh ??
    (smtpInFlight ??= probeSmtp(smtp.host, smtp.port)
      .then((result) => (smtpKnown = { at: Date.now(), result }).result)
      .finally(() => (smtpInFlight = null)));
  const [d, m] = await Promise.all([database, mail]);
  return { ok: d.ok && m.ok, database: d, mail: m };
}

async function probeDatabase(db: Database) {
  try {
    await db.execute(sql`select 1`);
    return { ok: true };
  } catch (err) {
    return { ok: false, detail: (err as Error).message };
  }
}

function probeSmtp(host: string, port: number): Promise<{ ok: boolean; detail?: string }> {
  return new Promise((resolve) => {
    const socket = net.connect({ host, port });
    const done = (result: { ok: boolean; detail?: string }) => {
      socket.destroy();
      resolve(result);
    };
    socket.setTimeout(2000, () => done({ ok: false, detail: `no answer from ${host}:${port}` }));
    socket.once('data', (chunk) =>
      done(chunk.toString().startsWith('220') ? { ok: true } : { ok: false, detail: 'unexpected greeting' }),
    );
    socket.once('error', (err) => done({ ok: false, detail: err.message }));
  });
}
