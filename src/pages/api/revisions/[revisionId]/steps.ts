import { authorize } from '../../../../lib/server/authorize';
import { endpoint, parseBody } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { PARTICIPANTS, READERS, projectOfRevision } from '../../../../lib/server/scope';
import { serverConfig } from '../../../../lib/config.server';
import { currentClientAddress } from '../../../../lib/auth/client-address';
import { ADDRESS_FAILURE_FACTOR } from '../../../../lib/auth/sign-in';
import { applyStep } from '../../../../lib/workflow/revision-workflow.server';
import { signOffsOf } from '../../../../lib/workflow/sign-offs.service';
import { stepSchema } from '../../../../lib/schemas/revision-actions.schema';

/** The sign-offs of a revision, each with whether it still covers the current inputs and results. */
export const GET = endpoint(async ({ locals, params }) => {
  const s = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  return Response.json({ signOffs: await signOffsOf(s, params.revisionId!) });
});

export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: PARTICIPANTS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  const body = await parseBody(request, stepSchema);
  const cfg = serverConfig();
  const revision = await applyStep(s, user, params.revisionId!, body, {
    clientAddress: currentClientAddress(),
    policy: { maxFailures: cfg.SIGN_IN_MAX_FAILURES, lockSeconds: cfg.SIGN_IN_LOCK_SECONDS, maxFailuresPerAddress: cfg.SIGN_IN_MAX_FAILURES * ADDRESS_FAILURE_FACTOR },
  });
  return Response.json({ id: revision.id, state: revision.state, version: revision.version });
});
