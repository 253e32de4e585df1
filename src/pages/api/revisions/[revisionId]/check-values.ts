import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { projectOfRevision } from '../../../../lib/server/scope';
import { addCheckValue } from '../../../../lib/studies/revision-items.service';
import { checkValueSchema } from '../../../../lib/schemas/revision-actions.schema';

export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['checker'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json(await addCheckValue(s, user, params.revisionId!, await parseBody(request, checkValueSchema)), { status: 201 });
});
