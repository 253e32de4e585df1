import type { APIContext, APIRoute } from 'astro';
import type { z } from 'zod';
import { AppError } from '../errors';
import { databaseAppError } from '../db/database-errors';
import { unstorableText } from './storable-text';
import '../schemas/plain-messages';

/** Wraps an endpoint so that catalogue errors become JSON with their status, and nothing else leaks. */
export function endpoint(handler: (ctx: APIContext) => Promise<Response> | Response): APIRoute {
  return async (ctx) => {
    try {
      return await handler(ctx);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** Seconds a client is asked to wait before trying again while a service is down. */
const RETRY_AFTER_SECONDS = 5;

export function errorResponse(err: unknown): Response {
  const known = err instanceof AppError ? err : databaseAppError(err);
  if (known) {
    if (known.errorName === 'Unavailable') console.error('[unavailable]', (err as Error).message);
    const headers: HeadersInit = known.status === 503 ? { 'Retry-After': String(RETRY_AFTER_SECONDS) } : {};
    return Response.json(known.toJSON(), { status: known.status, headers });
  }
  console.error(err);
  return Response.json(
    { error: 'Internal', title: 'Unexpected error', message: 'Something failed on the server; it has been logged.' },
    { status: 500 },
  );
}

/**
 * A zod failure as field errors. A strict object reports unknown keys as one issue on the object
 * itself; each key becomes its own field, so the error names what to remove or respell.
 */
export function issueFields(error: z.ZodError, root: string): Array<{ field: string; message: string }> {
  return error.issues.flatMap((i) =>
    i.code === 'unrecognized_keys'
      ? i.keys.map((key) => ({ field: [...i.path, key].join('.'), message: `Unknown field "${key}": check the spelling, or leave it out.` }))
      : [{ field: i.path.join('.') || root, message: i.message }],
  );
}

/** Parses a JSON body with a zod schema; every failing field is named in the error. */
export async function parseBody<S extends z.ZodType>(request: Request, schema: S): Promise<z.output<S>> {
  let raw: unknown;
  try {
    raw = await request.json();
  } catch {
    throw new AppError('InvalidInput', 'The request body is not valid JSON.');
  }
  const unstorable = unstorableText(raw);
  if (unstorable.length) throw new AppError('InvalidInput', undefined, unstorable);
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    throw new AppError('InvalidInput', undefined, issueFields(parsed.error, '(body)'));
  }
  return parsed.data;
}

/** Parses a URL's query parameters with a zod schema; every failing parameter is named. */
export function parseQuery<S extends z.ZodType>(url: URL, schema: S): z.output<S> {
  const parsed = schema.safeParse(Object.fromEntries(url.searchParams));
  if (!parsed.success) throw new AppError('InvalidInput', undefined, issueFields(parsed.error, '(query)'));
  return parsed.data;
}
