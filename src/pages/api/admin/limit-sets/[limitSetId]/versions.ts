import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { limitSetVersionSchema, publishLimitSetVersion } from '../../../../../lib/admin/limit-sets.service';
import { assertId } from '../../../../../lib/db/revisions.repo';

export const POST = endpoint(async ({ locals, params, request }) => {
  const admin = authorize(locals.user, { admin: true });
  const body = await parseBody(request, limitSetVersionSchema);
  return Response.json(await publishLimitSetVersion(await services(), admin, assertId(params.limitSetId, 'limit set'), body), { status: 201 });
});
