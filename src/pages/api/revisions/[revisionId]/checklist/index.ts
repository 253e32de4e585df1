import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { projectOfRevision } from '../../../../../lib/server/scope';
import { agreeWithRemaining } from '../../../../../lib/studies/revision-items.service';
import { agreeRemainingSchema } from '../../../../../lib/schemas/revision-actions.schema';

/** "Agree with every remaining item": the checker confirms how many items that covers. */
export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['checker'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json(await agreeWithRemaining(s, user, params.revisionId!, await parseBody(request, agreeRemainingSchema)));
});
