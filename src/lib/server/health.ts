import net from 'node:net';
import { sql } from 'drizzle-orm';
import type { Database } from '../db/client';

export interface HealthReport {
  ok: boolean;
  database: { ok: boolean; detail?: string };
  mail: { ok: boolean; detail?: string };
}

// Probes in flight, shared: twenty health requests at once cost one query and one SMTP greeting,
// not twenty, while every answer is still as fresh as the request (nothing is kept afterwards).
let inFlight: Promise<HealthReport> | null = null;

/** Answers whether the database takes a query and the SMTP server greets, each within 2 s. */
export function checkHealth(db: Database, smtp: { host: string; port: number }): Promise<HealthReport> {
  inFlight ??= (async () => {
    try {
      const [database, mail] = await Promise.all([probeDatabase(db), probeSmtp(smtp.host, smtp.port)]);
      return { ok: database.ok && mail.ok, database, mail };
    } finally {
      inFlight = null;
    }
  })();
  return inFlight;
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
