import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../lib/server/scope';
import { AppError } from '../../../../lib/errors';
import { routeProfile } from '../../../../lib/studies/route-profile.service';

/** The route profile of one case (?caseId=), for the plot: the stored results leave it out. */
export const GET = endpoint(async ({ locals, params, url }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(db, params.revisionId!) });
  const caseId = url.searchParams.get('caseId')?.trim();
  if (!caseId) throw new AppError('InvalidInput', undefined, [{ field: 'caseId', message: 'Name the case whose route profile you want (caseId).' }]);
  return Response.json(await routeProfile(db, params.revisionId!, caseId));
});
