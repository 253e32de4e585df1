import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';
import { database } from '../../../lib/server/services.server';
import { listUsers } from '../../../lib/db/users.repo';

export const GET = endpoint(async ({ locals }) => {
  authorize(locals.user, { admin: true });
  return Response.json({ users: await listUsers(database()) });
});
