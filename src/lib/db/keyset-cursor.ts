import { AppError } from '../errors';

// A keyset page position: the order it belongs to (sort and direction), the sort keys as text (so a
// timestamp keeps its microseconds) and the row id of the last row shown. Opaque to the client;
// base64url so it travels in a query string. A position is checked before any key reaches SQL: a
// forged or stale one (from another order) is a field error on `after`, never a database error
// or a page that silently starts in the wrong place.

/** The SQL types of sort keys, as the key's text must read to be cast to them. */
export type KeyType = 'text' | 'timestamptz' | 'date' | 'float8' | 'smallint';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const DATE = /^(\d{4})-(\d{2})-(\d{2})/;
const TIME = /^[ T]([01]\d|2[0-3]):[0-5]\d:[0-5]\d(\.\d{1,6})?([+-]\d{2}(:?\d{2})?|Z)$/;

/** A calendar date that exists (PostgreSQL refuses 2026-02-30). */
function realDate(text: string): boolean {
  const m = DATE.exec(text);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const date = new Date(Date.UTC(y, mo - 1, d));
  return y >= 1 && date.getUTCFullYear() === y && date.getUTCMonth() === mo - 1 && date.getUTCDate() === d;
}

const KEY_CHECKS: Record<KeyType, (key: string) => boolean> = {
  text: (k) => k.length <= 1000,
  timestamptz: (k) => realDate(k) && TIME.test(k.slice(10)),
  date: (k) => k.length === 10 && realDate(k),
  float8: (k) => /^-?\d+(\.\d+)?(e[+-]?\d+)?$/i.test(k) && Number.isFinite(Number(k)),
  smallint: (k) => /^-?\d{1,5}$/.test(k) && Math.abs(Number(k)) <= 32767,
};

export const encodeCursor = (order: string, keys: string[], id: string) => Buffer.from(JSON.stringify([order, keys, id])).toString('base64url');

/**
 * The keys and id of a position given out for this order (e.g. "code asc"), each key readable as
 * its type; otherwise a field error on `after` naming the list (e.g. "the studies list").
 */
export function decodeCursor(after: string, order: string, types: KeyType[], listName: string): [string[], string] {
  try {
    const [given, keys, id] = JSON.parse(Buffer.from(after, 'base64url').toString('utf8'));
    if (
      given === order &&
      Array.isArray(keys) &&
      keys.length === types.length &&
      keys.every((k, i) => typeof k === 'string' && KEY_CHECKS[types[i]](k)) &&
      typeof id === 'string' &&
      UUID.test(id)
    )
      return [keys, id];
  } catch {
    // fall through to the error below
  }
  throw new AppError('InvalidInput', undefined, [{ field: 'after', message: `This page position is not one ${listName} gave out for this order: start from the first page.` }]);
}
