import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { listAuditEvents } from '../../../lib/audit/audit-log';
import { auditQuery } from '../../../lib/audit/audit-query';

export const GET = endpoint(async ({ locals, url }) => {
  authorize(locals.user, { anyRole: ['auditor'] });
  const { page, pageSize, ...filter } = auditQuery(url);
  return Response.json({ page, pageSize, ...(await listAuditEvents((await services()).db, filter, page, pageSize)) });
});
