import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { myQueue } from '../../../lib/studies/queue.service';

export const GET = endpoint(async ({ locals }) => {
  const user = authorize(locals.user, { signedIn: true });
  return Response.json(await myQueue((await services()).db, user));
});
