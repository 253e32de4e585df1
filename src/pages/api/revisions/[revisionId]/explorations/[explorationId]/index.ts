import { authorize } from '../../../../../../lib/server/authorize';
import { endpoint } from '../../../../../../lib/server/http';
import { services } from '../../../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../../../lib/server/scope';
import { getExploration } from '../../../../../../lib/explore/explorations.service';

/** The job row: status and count done while it runs, the result when done. */
export const GET = endpoint(async ({ locals, params }) => {
  const s = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json(await getExploration(s, params.revisionId!, params.explorationId!), { headers: { 'Cache-Control': 'no-store' } });
});
