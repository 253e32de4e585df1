import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfStudy } from '../../../../lib/server/scope';
import { copyStudy } from '../../../../lib/studies/study-copy.service';
import { copyStudySchema } from '../../../../lib/schemas/study-copy.schema';

/** A copy of the study as a new study: the reader of the source must be a designer where the copy goes. */
export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfStudy(s.db, params.studyId!) });
  const body = await parseBody(request, copyStudySchema);
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: body.projectId });
  return Response.json(await copyStudy(s, user, params.studyId!, body), { status: 201 });
});
