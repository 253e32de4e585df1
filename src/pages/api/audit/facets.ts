import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { auditActors, auditTypes } from '../../../lib/audit/audit-log';
import { auditScopeFor } from '../../../lib/audit/audit-scope';

export const GET = endpoint(async ({ locals }) => {
  const scope = auditScopeFor(locals.user);
  const { db } = await services();
  const [people, types] = await Promise.all([auditActors(db, scope), auditTypes(db, scope)]);
  return Response.json({ people, types });
});
