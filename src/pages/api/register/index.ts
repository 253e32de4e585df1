import { endpoint, parseQuery } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { listRegister } from '../../../lib/register/register-query';
import { registerProjectIds, todayUtc } from '../../../lib/register/register-scope';
import { registerQuerySchema } from '../../../lib/schemas/register.schema';

/** The register across every project the person belongs to (or one of them, with projectId). */
export const GET = endpoint(async ({ locals, url }) => {
  const q = parseQuery(url, registerQuerySchema);
  const projectIds = registerProjectIds(locals.user, q.projectId);
  return Response.json(await listRegister((await services()).db, projectIds, q, todayUtc()));
});
