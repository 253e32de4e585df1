import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { publishLimitSetVersion } from '../../../../../lib/admin/limit-sets.service';
import { limitSetVersionSchema } from '../../../../../lib/schemas/limit-set.schema';
import { assertId } from '../../../../../lib/db/revisions.repo';

export const POST = endpoint(async ({ locals, params, request }) => {
  const admin = authorize(locals.user, { admin: true });
  const body = await parseBody(request, limitSetVersionSchema);
  return Response.json(await publishLimitSetVersion(await services(), admin, assertId(params.limitSetId, 'limit set'), body), { status: 201 });
});
