import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { addMember, removeMember } from '../../../../../lib/admin/memberships.service';
import { membershipSchema } from '../../../../../lib/schemas/revision-actions.schema';
import { assertId } from '../../../../../lib/db/revisions.repo';
import { listMembers } from '../../../../../lib/db/projects.repo';

export const GET = endpoint(async ({ locals, params }) => {
  authorize(locals.user, { admin: true });
  return Response.json({ members: await listMembers((await services()).db, assertId(params.projectId, 'project')) });
});

export const POST = endpoint(async ({ locals, params, request }) => {
  const admin = authorize(locals.user, { admin: true });
  const body = await parseBody(request, membershipSchema);
  await addMember(await services(), admin, assertId(params.projectId, 'project'), body.userId, body.role);
  return Response.json({ ok: true }, { status: 201 });
});

export const DELETE = endpoint(async ({ locals, params, request }) => {
  const admin = authorize(locals.user, { admin: true });
  const body = await parseBody(request, membershipSchema);
  await removeMember(await services(), admin, assertId(params.projectId, 'project'), body.userId, body.role);
  return Response.json({ ok: true });
});
