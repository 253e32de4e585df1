import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { projectOfStudy } from '../../../../../lib/server/scope';
import { applyProposals } from '../../../../../lib/register/reviews.service';
import { applyProposalsSchema } from '../../../../../lib/schemas/register.schema';

/** Writes the new values the designer confirmed into the draft revision. */
export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfStudy(s.db, params.studyId!) });
  const body = await parseBody(request, applyProposalsSchema);
  return Response.json(await applyProposals(s, user, params.studyId!, body));
});
