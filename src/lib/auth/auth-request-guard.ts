import { defineMiddleware } from 'astro:middleware';
import { AppError } from '../errors';
import { errorResponse } from '../server/http';
import { withClientAddress } from './client-address';

const AUTH_PREFIX = '/api/auth/';
// The Auth.js actions this app uses, and for those taking a provider, the one provider it has.
const ACTIONS = new Set(['providers', 'session', 'csrf', 'signin', 'signout', 'callback', 'verify-request', 'error']);
const WITH_PROVIDER = new Set(['signin', 'callback']);
const PROVIDERS = new Set(['credentials']);

/**
 * True for paths under /api/auth that Auth.js would not answer. auth-astro's route returns
 * nothing for an unknown action, which Astro reports as a 500; these get a 404 instead.
 */
export function isUnknownAuthPath(pathname: string): boolean {
  if (!pathname.startsWith(AUTH_PREFIX)) return false;
  const parts = pathname.slice(AUTH_PREFIX.length).split('/').filter((p, i, all) => p !== '' || i < all.length - 1);
  const [action, provider, ...rest] = parts;
  if (!action || !ACTIONS.has(action) || rest.length > 0) return true;
  if (provider === undefined) return false;
  return !WITH_PROVIDER.has(action) || !PROVIDERS.has(provider);
}

/**
 * Middleware for Auth.js's routes and sign-in: refuses unknown /api/auth paths with 404, and
 * runs the rest of the request with the client's address in reach of the sign-in throttle.
 */
export const authRequestGuard = defineMiddleware((context, next) => {
  if (isUnknownAuthPath(context.url.pathname)) return errorResponse(new AppError('NotFound', 'There is no such sign-in address.'));
  let address = 'unknown';
  try {
    address = context.clientAddress;
  } catch {
    // Prerendered or adapter without a socket: throttled together under 'unknown'.
  }
  return withClientAddress(address, () => next());
});
