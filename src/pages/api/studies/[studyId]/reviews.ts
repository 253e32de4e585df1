import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfStudy } from '../../../../lib/server/scope';
import { startReviewRevision, studyReviewState } from '../../../../lib/register/reviews.service';

/** The study's open reviews and the new values they propose. */
export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfStudy(db, params.studyId!) });
  return Response.json(await studyReviewState(db, params.studyId!));
});

/** Starts the next revision of the study under review; the designer then confirms each new value. */
export const POST = endpoint(async ({ locals, params }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: await projectOfStudy(s.db, params.studyId!) });
  return Response.json(await startReviewRevision(s, user, params.studyId!), { status: 201 });
});
