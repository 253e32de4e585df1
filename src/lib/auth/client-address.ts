import { AsyncLocalStorage } from 'node:async_hooks';

// Auth.js hands the Credentials provider a rebuilt Request without the socket, so the address
// the middleware saw is carried to sign-in through the request's async context instead of a
// header that a client could forge.
const store = new AsyncLocalStorage<string>();

export function withClientAddress<T>(address: string, work: () => T): T {
  return store.run(normaliseAddress(address), work);
}

/** The address of the client whose request is being handled, or 'unknown' outside a request. */
export function currentClientAddress(): string {
  return store.getStore() ?? 'unknown';
}

/**
 * One key per client: IPv4-mapped IPv6 becomes plain IPv4, and IPv6 is cut to its /64 network,
 * because one host commonly holds a whole /64 and could otherwise rotate addresses freely.
 */
export function normaliseAddress(raw: string): string {
  const address = raw.trim().toLowerCase();
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/.exec(address);
  if (mapped) return mapped[1];
  if (!address.includes(':')) return address || 'unknown';
  const [head, tail = ''] = address.split('%')[0].split('::');
  const left = head ? head.split(':') : [];
  const right = address.includes('::') && tail ? tail.split(':') : [];
  const groups = address.includes('::') ? [...left, ...Array(8 - left.length - right.length).fill('0'), ...right] : left;
  return `${groups.slice(0, 4).map((g) => g.replace(/^0+(?=.)/, '')).join(':')}::/64`;
}
