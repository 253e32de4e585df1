import { authorize } from '../../../lib/server/authorize';
import { endpoint } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { runRegisterDaily } from '../../../lib/register/reminders.service';

/** Runs the daily register job now (reminders due today, today's snapshot): each reminder is still sent at most once. */
export const POST = endpoint(async ({ locals }) => {
  authorize(locals.user, { admin: true });
  return Response.json(await runRegisterDaily(await services()));
});
