import { z } from 'zod';
import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../lib/server/scope';
import { AppError } from '../../../../lib/errors';
import { compareRevisions } from '../../../../lib/compare/compare.service';

const againstSchema = z.union([z.enum(['previous', 'last-issued']), z.uuid()], { error: 'against must be "previous", "last-issued" or the id of a revision of the same study.' });

/** This revision beside another of its study: ?against=previous (default), last-issued, or a revision id. */
export const GET = endpoint(async ({ locals, params, url }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(db, params.revisionId!) });
  const parsed = againstSchema.safeParse(url.searchParams.get('against') ?? 'previous');
  if (!parsed.success) throw new AppError('InvalidInput', undefined, [{ field: 'against', message: parsed.error.issues[0].message }]);
  const against = parsed.data === 'previous' || parsed.data === 'last-issued' ? parsed.data : { revisionId: parsed.data };
  return Response.json(await compareRevisions(db, params.revisionId!, against));
});
