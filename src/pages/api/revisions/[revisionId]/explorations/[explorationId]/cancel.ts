import { authorize } from '../../../../../../lib/server/authorize';
import { endpoint } from '../../../../../../lib/server/http';
import { services } from '../../../../../../lib/server/services.server';
import { projectOfRevision } from '../../../../../../lib/server/scope';
import { cancelExploration } from '../../../../../../lib/explore/explorations.service';

export const POST = endpoint(async ({ locals, params }) => {
  const s = await services();
  authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  const row = await cancelExploration(s, params.revisionId!, params.explorationId!);
  return Response.json({ id: row.id, status: row.status });
});
