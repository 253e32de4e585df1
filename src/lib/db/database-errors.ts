import { AppError } from '../errors';

// Connection-level failures: the database restarted, is down, or the pool is starved.
const UNAVAILABLE_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'ENOTFOUND', '57P01', '57P02', '57P03', '53300', '53400']);
const UNAVAILABLE_TEXT = /timeout exceeded when trying to connect|Connection terminated|connection error|Client was closed|the database system is (starting up|shutting down)/i;

interface PgLikeError {
  code?: string;
  constraint?: string;
  column?: string;
  detail?: string;
  message?: string;
  cause?: unknown;
}

/** The error itself and every `cause` below it (Drizzle wraps the driver's error). */
function causes(err: unknown): PgLikeError[] {
  const chain: PgLikeError[] = [];
  for (let e = err; e && typeof e === 'object' && chain.length < 5; e = (e as PgLikeError).cause) chain.push(e as PgLikeError);
  return chain;
}

/**
 * Translates what PostgreSQL or the driver refused into a catalogue error, so that a database
 * outage answers 503 and input the database cannot hold answers 4xx instead of 500. Returns
 * null for anything else. Services should still validate first and name the field; this is the
 * backstop that keeps a missed case from looking like a server fault.
 */
export function databaseAppError(err: unknown): AppError | null {
  for (const e of causes(err)) {
    const code = e.code ?? '';
    if (UNAVAILABLE_CODES.has(code) || code.startsWith('08') || UNAVAILABLE_TEXT.test(e.message ?? '')) {
      return new AppError('Unavailable', 'The database is not reachable at the moment. Nothing was saved; try again in a few seconds.');
    }
    if (code === '23505') return new AppError('Conflict', `That already exists (${e.constraint ?? 'a unique key'}); someone may have just created it. Reload and choose another value.`);
    if (code === '23503') return new AppError('InvalidInput', `The request refers to something that does not exist (${e.constraint ?? 'a reference'}).`);
    if (code === '40001' || code === '40P01') return new AppError('Conflict', 'Another change was made at the same moment. Reload and try again.');
    // Class 22: data exceptions (numbers out of range, characters PostgreSQL cannot store, bad dates).
    if (code.startsWith('22')) return new AppError('InvalidInput', `A value cannot be stored: ${(e.message ?? 'out of range').replace(/\s+/g, ' ').slice(0, 200)}.`);
  }
  return null;
}
