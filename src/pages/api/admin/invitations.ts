import { authorize } from '../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { inviteUser } from '../../../lib/admin/invitations.service';
import { invitationSchema } from '../../../lib/schemas/revision-actions.schema';

export const POST = endpoint(async ({ locals, request }) => {
  const admin = authorize(locals.user, { admin: true });
  return Response.json(await inviteUser(await services(), admin, await parseBody(request, invitationSchema)), { status: 201 });
});
