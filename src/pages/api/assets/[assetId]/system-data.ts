import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { projectOfAsset } from '../../../../lib/register/assets.service';
import { publishSystemData } from '../../../../lib/register/system-data.service';
import { systemDataSchema } from '../../../../lib/schemas/register.schema';

/** Publishes a new version of a site's system data; the issued studies it makes non-conservative are marked for review. */
export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['approver'], projectId: await projectOfAsset(s.db, params.assetId!) });
  const body = await parseBody(request, systemDataSchema);
  return Response.json(await publishSystemData(s, user, params.assetId!, body), { status: 201 });
});
