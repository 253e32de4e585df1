import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { projectOfRevision } from '../../../../lib/server/scope';
import { calculateRevision } from '../../../../lib/studies/studies.service';

export const POST = endpoint(async ({ locals, params }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  const revision = await calculateRevision(s, user, params.revisionId!);
  return Response.json({ id: revision.id, version: revision.version, engineVersion: revision.engineVersion, inputsHash: revision.inputsHash });
});
