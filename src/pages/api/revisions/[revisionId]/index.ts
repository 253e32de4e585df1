import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../lib/server/scope';
import { revisionDetail } from '../../../../lib/db/revisions.repo';

export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(db, params.revisionId!) });
  return Response.json(await revisionDetail(db, params.revisionId!));
});
