import { authorize } from '../../../../../../lib/server/authorize';
import { endpoint } from '../../../../../../lib/server/http';
import { services } from '../../../../../../lib/server/services.server';
import { projectOfRevision } from '../../../../../../lib/server/scope';
import { saveExploration } from '../../../../../../lib/explore/explorations.service';

export const POST = endpoint(async ({ locals, params }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  const row = await saveExploration(s, user, params.revisionId!, params.explorationId!);
  return Response.json({ id: row.id, savedAt: row.savedAt });
});
