import { z } from 'zod';
import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS } from '../../../../lib/server/scope';
import { createStudy, listStudies } from '../../../../lib/studies/studies.service';
import { newStudySchema, listQuerySchema } from '../../../../lib/schemas/revision-actions.schema';
import { revisionStates } from '../../../../lib/workflow/revision.machine';
import { AppError } from '../../../../lib/errors';

const studyListSchema = z.object({
  pageSize: listQuerySchema.shape.pageSize,
  after: z.string().max(2000).optional(),
  sort: z.enum(['code', 'title', 'updated']).default('code'),
  direction: z.enum(['asc', 'desc']).default('asc'),
  state: z.enum(revisionStates).optional(),
  kind: z.enum(['bonding', 'exposure']).optional(),
  search: z.string().trim().max(100).optional(),
});

export const GET = endpoint(async ({ locals, params, url }) => {
  authorize(locals.user, { anyRole: READERS, projectId: params.projectId });
  const query = studyListSchema.safeParse(Object.fromEntries(url.searchParams));
  if (!query.success) throw new AppError('InvalidInput', undefined, query.error.issues.map((i) => ({ field: i.path.join('.'), message: i.message })));
  return Response.json(await listStudies((await services()).db, params.projectId!, query.data));
});

export const POST = endpoint(async ({ locals, params, request }) => {
  const user = authorize(locals.user, { anyRole: ['designer'], projectId: params.projectId });
  const body = await parseBody(request, newStudySchema);
  return Response.json(await createStudy(await services(), user, params.projectId!, body), { status: 201 });
});
