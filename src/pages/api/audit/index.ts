import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { listAuditEvents } from '../../../lib/audit/audit-log';
import { auditQuery } from '../../../lib/audit/audit-query';
import { auditScopeFor } from '../../../lib/audit/audit-scope';

export const GET = endpoint(async ({ locals, url }) => {
  const scope = auditScopeFor(locals.user);
  const { page, pageSize, ...filter } = auditQuery(url);
  return Response.json({ page, pageSize, ...(await listAuditEvents((await services()).db, scope, filter, page, pageSize)) });
});
