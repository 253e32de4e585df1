import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { verifyAuditChain } from '../../../lib/audit/audit-log';

export const GET = endpoint(async ({ locals }) => {
  authorize(locals.user, { anyRole: ['auditor'] });
  return Response.json(await verifyAuditChain((await services()).db));
});
