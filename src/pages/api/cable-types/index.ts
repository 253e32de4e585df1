import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { listCableTypes } from '../../../lib/admin/cable-types.service';

export const GET = endpoint(async ({ locals }) => {
  authorize(locals.user, { signedIn: true });
  return Response.json({ cableTypes: await listCableTypes((await services()).db) });
});
