import { z } from 'zod';
import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { serverConfig } from '../../../lib/config.server';
import { AppError } from '../../../lib/errors';
import { verifyAuditChain } from '../../../lib/audit/audit-verify';
import { auditScopeFor } from '../../../lib/audit/audit-scope';

const modeSchema = z.enum(['full', 'incremental'], { error: 'mode must be "full" (from the first event) or "incremental" (from the last checkpoint).' });

/** ?mode=full (default) walks the whole chain; ?mode=incremental continues from the last checkpoint. */
export const GET = endpoint(async ({ locals, url }) => {
  const scope = auditScopeFor(locals.user);
  const mode = modeSchema.safeParse(url.searchParams.get('mode') ?? 'full');
  if (!mode.success) throw new AppError('InvalidInput', undefined, [{ field: 'mode', message: mode.error.issues[0].message }]);
  return Response.json(await verifyAuditChain((await services()).db, serverConfig().DATABASE_URL, scope, mode.data));
});
