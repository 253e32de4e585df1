import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { linkStudy, projectOfAsset } from '../../../../lib/register/assets.service';
import { studyLinkSchema } from '../../../../lib/schemas/register.schema';

/** Records that a study covers this asset. */
export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer', 'approver'], projectId: await projectOfAsset(s.db, params.assetId!) });
  const body = await parseBody(request, studyLinkSchema);
  return Response.json(await linkStudy(s, user, params.assetId!, body), { status: 201 });
});
