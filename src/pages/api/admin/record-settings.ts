import { authorize } from '../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../lib/server/http';
import { services } from '../../../lib/server/services.server';
import { recordSettingsOf, recordSettingsSchema, setRecordSettings } from '../../../lib/admin/record-settings.service';

export const GET = endpoint(async ({ locals }) => {
  authorize(locals.user, { admin: true });
  return Response.json(await recordSettingsOf((await services()).db));
});

export const PUT = endpoint(async ({ locals, request }) => {
  const admin = authorize(locals.user, { admin: true });
  const body = await parseBody(request, recordSettingsSchema);
  return Response.json(await setRecordSettings(await services(), admin, body));
});
