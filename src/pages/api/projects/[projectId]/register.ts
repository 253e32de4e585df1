import { endpoint, parseQuery } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { assertId } from '../../../../lib/db/revisions.repo';
import { listRegister } from '../../../../lib/register/register-query';
import { registerProjectIds, todayUtc } from '../../../../lib/register/register-scope';
import { registerQuerySchema } from '../../../../lib/schemas/register.schema';

export const GET = endpoint(async ({ locals, params, url }) => {
  const projectIds = registerProjectIds(locals.user, assertId(params.projectId, 'project'));
  const q = parseQuery(url, registerQuerySchema.omit({ projectId: true }));
  return Response.json(await listRegister((await services()).db, projectIds, q, todayUtc()));
});
