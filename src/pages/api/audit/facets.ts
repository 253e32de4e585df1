import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { auditFacets } from '../../../lib/audit/audit-log';
import { auditScopeFor } from '../../../lib/audit/audit-scope';

export const GET = endpoint(async ({ locals }) => {
  const scope = auditScopeFor(locals.user);
  return Response.json(await auditFacets((await services()).db, scope));
});
