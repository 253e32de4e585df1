import { asc, eq } from 'drizzle-orm';
import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfStudy } from '../../../../lib/server/scope';
import { loadStudyScope } from '../../../../lib/db/revisions.repo';
import { revisions } from '../../../../lib/db/schema';

export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfStudy(db, params.studyId!) });
  const scope = await loadStudyScope(db, params.studyId!);
  const list = await db
    .select({ id: revisions.id, number: revisions.number, state: revisions.state, updatedAt: revisions.updatedAt, issuedAt: revisions.issuedAt })
    .from(revisions)
    .where(eq(revisions.studyId, params.studyId!))
    .orderBy(asc(revisions.number));
  return Response.json({ ...scope, revisions: list });
});
