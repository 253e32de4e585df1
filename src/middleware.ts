import { defineMiddleware } from 'astro:middleware';
import { getSession } from 'auth-astro/server';
import { database } from './lib/db/database.server';
import { loadSessionUser } from './lib/db/users.repo';
import { AppError } from './lib/errors';
import { errorResponse } from './lib/server/http';

// Reachable without a session: sign-in, Auth.js's own routes, the health probe, static files.
const PUBLIC_PREFIXES = ['/signin', '/api/auth/', '/api/health', '/_astro/', '/favicon'];

export const onRequest = defineMiddleware(async (context, next) => {
  const { pathname } = context.url;
  context.locals.user = null;
  if (PUBLIC_PREFIXES.some((p) => pathname.startsWith(p))) return next();

  const session = await getSession(context.request);
  const id = (session?.user as { id?: string } | undefined)?.id;
  context.locals.user = id ? await loadSessionUser(database(), id) : null;

  if (!context.locals.user) {
    if (pathname.startsWith('/api/')) return errorResponse(new AppError('NotSignedIn'));
    const back = encodeURIComponent(pathname + context.url.search);
    return context.redirect(`/signin?next=${back}`);
  }
  return next();
});
