import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS } from '../../../../lib/server/scope';
import { assetDetail, loadAsset } from '../../../../lib/register/assets.service';

export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: (await loadAsset(db, params.assetId!)).projectId });
  return Response.json(await assetDetail(db, params.assetId!));
});
