import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS } from '../../../../lib/server/scope';
import { loadRevisionScopeWithResultsText, revisionDetailJson } from '../../../../lib/db/revisions.repo';

export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  const scope = await loadRevisionScopeWithResultsText(db, params.revisionId!);
  authorize(locals.user, { anyRole: READERS, projectId: scope.project.id });
  // A Buffer body: a string of this size would be checked character by character on the way out.
  return new Response(Buffer.from(await revisionDetailJson(db, scope)), { headers: { 'Content-Type': 'application/json' } });
});
