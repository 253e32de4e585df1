import { allRoles } from '../../../lib/auth/roles';
import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';

export const GET = endpoint(({ locals }) => {
  const user = authorize(locals.user, { signedIn: true });
  return Response.json({ ...user, roles: allRoles(user) });
});
