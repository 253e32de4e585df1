import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { addCableType } from '../../../../lib/admin/cable-types.service';
import { cableTypeSchema } from '../../../../lib/schemas/bonding-study.schema';

export const POST = endpoint(async ({ locals, request }) => {
  const admin = authorize(locals.user, { admin: true });
  return Response.json(await addCableType(await services(), admin, await parseBody(request, cableTypeSchema)), { status: 201 });
});
