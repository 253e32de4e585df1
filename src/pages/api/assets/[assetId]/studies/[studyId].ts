import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { editStudyLink, projectOfAsset, unlinkStudy } from '../../../../../lib/register/assets.service';
import { studyLinkEditSchema } from '../../../../../lib/schemas/register.schema';

/** Changes the circuit in the study, or the site's route end, of this study's link to the asset. */
export const PATCH = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer', 'approver'], projectId: await projectOfAsset(s.db, params.assetId!) });
  const body = await parseBody(request, studyLinkEditSchema);
  return Response.json(await editStudyLink(s, user, params.assetId!, params.studyId!, body));
});

/** Records that the study no longer covers the asset. */
export const DELETE = endpoint(async ({ locals, params }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer', 'approver'], projectId: await projectOfAsset(s.db, params.assetId!) });
  return Response.json(await unlinkStudy(s, user, params.assetId!, params.studyId!));
});
