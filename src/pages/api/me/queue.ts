import { z } from 'zod';
import { authorize } from '../../../lib/server/authorize';
import { endpoint, parseQuery } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { myQueue, queuePage, queueRoles } from '../../../lib/studies/queue.service';

// With no role: the first page of each queue and recent activity. With a role and a position: the next page of that queue.
const queueQuerySchema = z
  .object({ role: z.enum(queueRoles).optional(), after: z.string().max(2000).optional() })
  .strict()
  .refine((q) => !q.after || q.role, { path: ['role'], message: 'Name the queue the position belongs to: designer, checker or approver.' });

export const GET = endpoint(async ({ locals, url }) => {
  const user = authorize(locals.user, { signedIn: true });
  const { role, after } = parseQuery(url, queueQuerySchema);
  const { db } = await services();
  return Response.json(role ? await queuePage(db, user, role, after) : await myQueue(db, user));
});
