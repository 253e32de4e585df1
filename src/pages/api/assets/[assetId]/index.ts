import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS } from '../../../../lib/server/scope';
import { assetDetail, editAsset, loadAsset, projectOfAsset, removeAsset } from '../../../../lib/register/assets.service';
import { assetEditSchema } from '../../../../lib/schemas/register.schema';

export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: (await loadAsset(db, params.assetId!)).projectId });
  return Response.json(await assetDetail(db, params.assetId!));
});

/** Changes the asset's details (as many fields as are sent). */
export const PATCH = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer', 'approver'], projectId: await projectOfAsset(s.db, params.assetId!) });
  const body = await parseBody(request, assetEditSchema);
  return Response.json(await editAsset(s, user, params.assetId!, body));
});

/** Takes the asset off the register (its records and audit trail stay). */
export const DELETE = endpoint(async ({ locals, params }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer', 'approver'], projectId: await projectOfAsset(s.db, params.assetId!) });
  return Response.json(await removeAsset(s, user, params.assetId!));
});
