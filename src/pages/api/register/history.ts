import { z } from 'zod';
import { endpoint, parseQuery } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { registerHistory } from '../../../lib/register/register-query';
import { registerProjectIds, todayUtc } from '../../../lib/register/register-scope';
import { addDays } from '../../../lib/register/due-dates';

const historySchema = z.object({ projectId: z.uuid().optional(), days: z.coerce.number().int().min(1).max(730).default(90) });

/** Status counts per day (the daily snapshots) for the chart. */
export const GET = endpoint(async ({ locals, url }) => {
  const q = parseQuery(url, historySchema);
  const projectIds = registerProjectIds(locals.user, q.projectId);
  return Response.json({ days: await registerHistory((await services()).db, projectIds, addDays(todayUtc(), -q.days)) });
});
