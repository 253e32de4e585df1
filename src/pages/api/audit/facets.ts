import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { auditActors, auditTypes } from '../../../lib/audit/audit-log';

export const GET = endpoint(async ({ locals }) => {
  authorize(locals.user, { anyRole: ['auditor'] });
  const { db } = await services();
  const [people, types] = await Promise.all([auditActors(db), auditTypes(db)]);
  return Response.json({ people, types });
});
