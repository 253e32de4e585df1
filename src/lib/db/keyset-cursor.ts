import { AppError } from '../errors';

// A keyset page position: the sort key (as text, so a timestamp keeps its microseconds) and the
// row id of the last row shown. Opaque to the client; base64url so it travels in a query string.

export const encodeCursor = (key: string, id: string) => Buffer.from(JSON.stringify([key, id])).toString('base64url');

/** The position, or a field error on `after` naming what the list is (e.g. "the studies list"). */
export function decodeCursor(after: string, listName: string): [string, string] {
  try {
    const [key, id] = JSON.parse(Buffer.from(after, 'base64url').toString('utf8'));
    if (typeof key === 'string' && typeof id === 'string' && /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id)) return [key, id];
  } catch {
    // fall through to the error below
  }
  throw new AppError('InvalidInput', undefined, [{ field: 'after', message: `This page position is not one ${listName} gave out: start from the first page.` }]);
}
