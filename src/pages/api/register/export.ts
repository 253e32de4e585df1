import { endpoint, parseQuery } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { exportRegisterCsv } from '../../../lib/register/register-query';
import { registerProjectIds, todayUtc } from '../../../lib/register/register-scope';
import { registerQuerySchema } from '../../../lib/schemas/register.schema';

export const GET = endpoint(async ({ locals, url }) => {
  const q = parseQuery(url, registerQuerySchema.omit({ after: true, pageSize: true }));
  const projectIds = registerProjectIds(locals.user, q.projectId);
  const csv = await exportRegisterCsv((await services()).db, projectIds, { ...q, pageSize: 200 }, todayUtc());
  return new Response(csv, { headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="sheathwise-register-${todayUtc()}.csv"` } });
});
