import { endpoint, parseBody } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { acceptInvitation } from '../../../lib/admin/invitations.service';
import { acceptInvitationSchema } from '../../../lib/schemas/revision-actions.schema';

// Public: the token in the link is the credential.
export const POST = endpoint(async ({ request }) => {
  const body = await parseBody(request, acceptInvitationSchema);
  return Response.json(await acceptInvitation(await services(), body.token, body.password), { status: 201 });
});
