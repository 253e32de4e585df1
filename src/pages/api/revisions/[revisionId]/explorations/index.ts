import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../../lib/server/scope';
import { listExplorations, startExploration } from '../../../../../lib/explore/explorations.service';
import { explorationRequestSchema } from '../../../../../lib/schemas/exploration.schema';

export const GET = endpoint(async ({ locals, params }) => {
  const s = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json({ explorations: await listExplorations(s, params.revisionId!) });
});

/** Starts an exploration; 202 with the job row, then poll its address for progress. */
export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  const row = await startExploration(s, user, params.revisionId!, await parseBody(request, explorationRequestSchema));
  return Response.json(row, { status: 202 });
});
