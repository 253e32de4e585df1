import { eq } from 'drizzle-orm';
import { authorize } from '../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { PARTICIPANTS, projectOfRevision } from '../../../lib/server/scope';
import { setRemarkResolved } from '../../../lib/studies/revision-items.service';
import { remarkUpdateSchema } from '../../../lib/schemas/revision-actions.schema';
import { remarks } from '../../../lib/db/schema';
import { AppError } from '../../../lib/errors';
import { assertId } from '../../../lib/db/revisions.repo';

export const PATCH = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const [remark] = await s.db.select({ revisionId: remarks.revisionId }).from(remarks).where(eq(remarks.id, assertId(params.remarkId, 'remark')));
  if (!remark) throw new AppError('NotFound', 'There is no remark with this id.');
  const user = authorize(locals.user, { anyRole: PARTICIPANTS, projectId: await projectOfRevision(s.db, remark.revisionId) });
  const body = await parseBody(request, remarkUpdateSchema);
  return Response.json(await setRemarkResolved(s, user, params.remarkId!, body.resolved));
});
