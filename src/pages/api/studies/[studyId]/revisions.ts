import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { projectOfStudy } from '../../../../lib/server/scope';
import { startNewRevision } from '../../../../lib/studies/studies.service';

export const POST = endpoint(async ({ locals, params }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfStudy(s.db, params.studyId!) });
  return Response.json(await startNewRevision(s, user, params.studyId!), { status: 201 });
});
