import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../lib/server/scope';
import { bondingChoiceOf, chooseBondingOption } from '../../../../lib/explore/explorations.service';
import { bondingChoiceSchema } from '../../../../lib/schemas/exploration.schema';

export const GET = endpoint(async ({ locals, params }) => {
  const s = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json({ choice: await bondingChoiceOf(s, params.revisionId!) });
});

export const PUT = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json({ choice: await chooseBondingOption(s, user, params.revisionId!, await parseBody(request, bondingChoiceSchema)) });
});
