import { asc, eq } from 'drizzle-orm';
import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { PARTICIPANTS, READERS, projectOfRevision } from '../../../../lib/server/scope';
import { addRemark } from '../../../../lib/studies/revision-items.service';
import { remarkSchema } from '../../../../lib/schemas/revision-actions.schema';
import { remarks } from '../../../../lib/db/schema';

export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(db, params.revisionId!) });
  return Response.json({ remarks: await db.select().from(remarks).where(eq(remarks.revisionId, params.revisionId!)).orderBy(asc(remarks.createdAt)) });
});

export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: PARTICIPANTS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json(await addRemark(s, user, params.revisionId!, await parseBody(request, remarkSchema)), { status: 201 });
});
