import { AppError } from '../errors';

// A keyset page position: the sort keys (as text, so a timestamp keeps its microseconds) and the
// row id of the last row shown. Opaque to the client; base64url so it travels in a query string.

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const encodeCursor = (keys: string[], id: string) => Buffer.from(JSON.stringify([keys, id])).toString('base64url');

/** The position, or a field error on `after` naming what the list is (e.g. "the studies list"). */
export function decodeCursor(after: string, keyCount: number, listName: string): [string[], string] {
  try {
    const [keys, id] = JSON.parse(Buffer.from(after, 'base64url').toString('utf8'));
    if (Array.isArray(keys) && keys.length === keyCount && keys.every((k) => typeof k === 'string') && typeof id === 'string' && UUID.test(id)) return [keys, id];
  } catch {
    // fall through to the error below
  }
  throw new AppError('InvalidInput', undefined, [{ field: 'after', message: `This page position is not one ${listName} gave out: start from the first page.` }]);
}
