import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { projectOfStudy } from '../../../../lib/server/scope';
import { startNewRevision } from '../../../../lib/studies/studies.service';
import { newRevisionSchema } from '../../../../lib/schemas/study-copy.schema';

export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfStudy(s.db, params.studyId!) });
  // No body: from the latest revision, as before; a body may name the issued revision to start from.
  const body = (await request.clone().text()).trim() ? await parseBody(request, newRevisionSchema) : {};
  return Response.json(await startNewRevision(s, user, params.studyId!, body.fromRevisionId), { status: 201 });
});
