import { authorize } from '../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { addObligationType, listObligationTypes } from '../../../lib/register/obligations.service';
import { obligationTypeSchema } from '../../../lib/schemas/register.schema';

export const GET = endpoint(async ({ locals }) => {
  authorize(locals.user, { admin: true });
  return Response.json({ obligationTypes: await listObligationTypes((await services()).db) });
});

export const POST = endpoint(async ({ locals, request }) => {
  const admin = authorize(locals.user, { admin: true });
  const body = await parseBody(request, obligationTypeSchema);
  return Response.json(await addObligationType(await services(), admin, body), { status: 201 });
});
