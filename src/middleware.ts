import { defineMiddleware, sequence } from 'astro:middleware';
import { database, services } from './lib/server/services.server';
import { AppError } from './lib/errors';
import { errorResponse } from './lib/server/http';
import { securityHeaders } from './lib/server/security-headers';
import { authRequestGuard } from './lib/auth/auth-request-guard';
import { signedInUser } from './lib/auth/sessions';
import { sessionClaims } from './lib/auth/session-token';
import { serverConfig } from './lib/config.server';

// Reachable without a session: sign-in, Auth.js's own routes, the health probe, accepting an
// invitation (the link's token is the credential), static files.
const PUBLIC_PREFIXES = ['/signin', '/api/auth/', '/api/health', '/api/invitations/accept', '/invitation/', '/_astro/', '/favicon'];

const UNAVAILABLE_PAGE = '<!doctype html><meta charset="utf-8"><title>Sheathwise is unavailable</title><meta http-equiv="refresh" content="10"><p>Sheathwise cannot reach its database at the moment. Nothing was lost; this page tries again every 10 seconds.</p>';

const appMiddleware = defineMiddleware(async (context, next) => {
  // The first request starts the mail worker, so queued messages go out without waiting for a workflow call.
  void services().catch((err) => console.error('[services]', err));
  const { pathname } = context.url;
  context.locals.user = null;
  if (PUBLIC_PREFIXES.some((p) => pathname.startsWith(p))) return next();

  const claims = await sessionClaims((name) => context.cookies.get(name)?.value, serverConfig().AUTH_SECRET);
  try {
    context.locals.user = await signedInUser(database(), claims);
  } catch (err) {
    // The database is down: say so (503 with Retry-After) rather than fail with a bare 500.
    const response = errorResponse(err);
    if (pathname.startsWith('/api/') || response.status !== 503) return response;
    return new Response(UNAVAILABLE_PAGE, { status: 503, headers: { 'Content-Type': 'text/html; charset=utf-8', 'Retry-After': response.headers.get('Retry-After') ?? '5' } });
  }

  if (!context.locals.user) {
    if (pathname.startsWith('/api/')) return errorResponse(new AppError('NotSignedIn'));
    const back = encodeURIComponent(pathname + context.url.search);
    return context.redirect(`/signin?next=${back}`);
  }
  return next();
});

// Outermost first: headers on every answer, then Auth.js path checks and the client address.
export const onRequest = sequence(securityHeaders, authRequestGuard, appMiddleware);
