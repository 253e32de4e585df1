import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { projectOfRevision } from '../../../../lib/server/scope';
import { updateInputs } from '../../../../lib/studies/studies.service';
import { updateInputsSchema } from '../../../../lib/schemas/revision-actions.schema';

export const PUT = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  const body = await parseBody(request, updateInputsSchema);
  return Response.json(await updateInputs(s, user, params.revisionId!, body.inputs, body.version));
});
