import { authorize } from '../../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../../lib/server/http';
import { services } from '../../../../../lib/server/services.server';
import { assertId } from '../../../../../lib/db/revisions.repo';
import { documentNumberPatternSchema } from '../../../../../lib/admin/document-number';
import { projectDocumentNumberPattern, setDocumentNumberPattern } from '../../../../../lib/admin/document-numbers.service';

export const GET = endpoint(async ({ locals, params }) => {
  authorize(locals.user, { admin: true });
  return Response.json(await projectDocumentNumberPattern((await services()).db, assertId(params.projectId, 'project')));
});

export const PUT = endpoint(async ({ locals, params, request }) => {
  const admin = authorize(locals.user, { admin: true });
  const body = await parseBody(request, documentNumberPatternSchema);
  const s = await services();
  const projectId = assertId(params.projectId, 'project');
  await setDocumentNumberPattern(s, admin, projectId, body.pattern);
  return Response.json(await projectDocumentNumberPattern(s.db, projectId));
});
