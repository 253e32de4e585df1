import { authorize } from '../../../../../../lib/server/authorize';
import { endpoint } from '../../../../../../lib/server/http';
import { services } from '../../../../../../lib/server/services.server';
import { projectOfRevision } from '../../../../../../lib/server/scope';
import { acceptPlacement } from '../../../../../../lib/explore/accept-placement.service';

/** Starts the next revision with a placement's suggested minor-section lengths (audited). */
export const POST = endpoint(async ({ locals, params }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  const created = await acceptPlacement(s, user, params.revisionId!, params.explorationId!);
  return Response.json({ id: created.id, number: created.number }, { status: 201 });
});
