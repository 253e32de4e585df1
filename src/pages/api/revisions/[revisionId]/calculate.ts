import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { loadCalculationScope } from '../../../../lib/db/revisions.repo';
import { calculateRevision } from '../../../../lib/studies/studies.service';

export const POST = endpoint(async ({ locals, params }) => {
  const s = await services();
  const scope = await loadCalculationScope(s.db, params.revisionId!);
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: scope.study.projectId });
  const revision = await calculateRevision(s, user, scope);
  return Response.json({ id: revision.id, version: revision.version, engineVersion: revision.engineVersion, inputsHash: revision.inputsHash, unchanged: revision.unchanged });
});
