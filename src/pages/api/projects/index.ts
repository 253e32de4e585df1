import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';
import { database } from '../../../lib/server/services.server';
import { listProjectsFor } from '../../../lib/db/projects.repo';

export const GET = endpoint(async ({ locals }) => {
  const user = authorize(locals.user, { signedIn: true });
  return Response.json({ projects: await listProjectsFor(database(), user) });
});
