import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS } from '../../../../lib/server/scope';
import { AppError } from '../../../../lib/errors';
import { routeProfileJson } from '../../../../lib/studies/route-profile.service';

/** The route profile of one case (?caseId=), for the plot: the stored results leave it out. */
export const GET = endpoint(async ({ locals, params, url }) => {
  const { db } = await services();
  const caseId = url.searchParams.get('caseId')?.trim();
  const body = await routeProfileJson(db, params.revisionId!, caseId ?? '', (projectId) => {
    authorize(locals.user, { anyRole: READERS, projectId });
    if (!caseId) throw new AppError('InvalidInput', undefined, [{ field: 'caseId', message: 'Name the case whose route profile you want (caseId).' }]);
  });
  return new Response(Buffer.from(body), { headers: { 'Content-Type': 'application/json' } });
});
