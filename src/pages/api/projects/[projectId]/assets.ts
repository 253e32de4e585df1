import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS } from '../../../../lib/server/scope';
import { assertId } from '../../../../lib/db/revisions.repo';
import { createAsset, listProjectAssets } from '../../../../lib/register/assets.service';
import { newAssetSchema } from '../../../../lib/schemas/register.schema';

export const GET = endpoint(async ({ locals, params }) => {
  const projectId = assertId(params.projectId, 'project');
  authorize(locals.user, { anyRole: READERS, projectId });
  return Response.json({ assets: await listProjectAssets((await services()).db, projectId) });
});

export const POST = endpoint(async ({ locals, params, request }) => {
  const projectId = assertId(params.projectId, 'project');
  const user = authorize(locals.user, { anyRole: ['designer', 'approver'], projectId });
  const body = await parseBody(request, newAssetSchema);
  return Response.json(await createAsset(await services(), user, projectId, body), { status: 201 });
});
