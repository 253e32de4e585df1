import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { exportAuditCsv } from '../../../lib/audit/audit-log';
import { auditQuery } from '../../../lib/audit/audit-query';
import { auditScopeFor } from '../../../lib/audit/audit-scope';

export const GET = endpoint(async ({ locals, url }) => {
  const scope = auditScopeFor(locals.user);
  const { page: _page, pageSize: _size, ...filter } = auditQuery(url);
  const csv = await exportAuditCsv((await services()).db, scope, filter);
  return new Response(csv, {
    headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="sheathwise-audit-${new Date().toISOString().slice(0, 10)}.csv"` },
  });
});
