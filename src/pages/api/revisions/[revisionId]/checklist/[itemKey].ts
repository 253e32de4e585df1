import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { PARTICIPANTS, projectOfRevision } from '../../../../../lib/server/scope';
import { updateChecklistItem } from '../../../../../lib/studies/revision-items.service';
import { checklistUpdateSchema } from '../../../../../lib/schemas/revision-actions.schema';

export const PUT = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: PARTICIPANTS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  const body = await parseBody(request, checklistUpdateSchema);
  return Response.json(await updateChecklistItem(s, user, params.revisionId!, decodeURIComponent(params.itemKey!), body));
});
