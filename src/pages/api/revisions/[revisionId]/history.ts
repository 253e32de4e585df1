import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../lib/server/scope';
import { revisionHistory } from '../../../../lib/audit/revision-history';

// The revision's own history for everyone who can read it (told with its number and study code);
// the full trail is the auditor's.
export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(db, params.revisionId!) });
  return Response.json({ events: await revisionHistory(db, params.revisionId!) });
});
