import { authorize } from '../../../../../../lib/server/authorize';
import { endpoint } from '../../../../../../lib/server/http';
import { services } from '../../../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../../../lib/server/scope';
import { getExploration } from '../../../../../../lib/explore/explorations.service';
import { explorationEventStream } from '../../../../../../lib/explore/exploration-events';

/** The job's progress as server-sent events (`progress`, then `end`); the row's address stays the fallback. */
export const GET = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  // Unknown or another revision's id: 404 now, not an empty stream.
  await getExploration(s, params.revisionId!, params.explorationId!);
  return new Response(explorationEventStream(s, params.revisionId!, params.explorationId!, request.signal), {
    headers: {
      'Content-Type': 'text/event-stream; charset=utf-8',
      // no-transform: the server's compression would hold the events back until its buffer fills.
      'Cache-Control': 'no-store, no-transform',
      'X-Accel-Buffering': 'no',
    },
  });
});
