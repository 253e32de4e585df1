import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { PARTICIPANTS, projectOfRevision } from '../../../../lib/server/scope';
import { applyStep } from '../../../../lib/workflow/revision-workflow.server';
import { stepSchema } from '../../../../lib/schemas/revision-actions.schema';

export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: PARTICIPANTS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  const body = await parseBody(request, stepSchema);
  const revision = await applyStep(s, user, params.revisionId!, body);
  return Response.json({ id: revision.id, state: revision.state, version: revision.version });
});
