import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { listLimitSets } from '../../../lib/admin/limit-sets.service';

export const GET = endpoint(async ({ locals }) => {
  authorize(locals.user, { signedIn: true });
  return Response.json({ limitSets: await listLimitSets((await services()).db) });
});
