import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { projectOfRevision } from '../../../../../lib/server/scope';
import { deleteCheckValue, updateCheckValue } from '../../../../../lib/studies/revision-items.service';
import { checkValueUpdateSchema } from '../../../../../lib/schemas/revision-actions.schema';

export const PUT = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['checker'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json(await updateCheckValue(s, user, params.revisionId!, params.checkValueId!, await parseBody(request, checkValueUpdateSchema)));
});

export const DELETE = endpoint(async ({ locals, params }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['checker'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json(await deleteCheckValue(s, user, params.revisionId!, params.checkValueId!));
});
