import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS } from '../../../../lib/server/scope';
import { revisionDetailBytes } from '../../../../lib/db/revision-detail-bytes';

export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  const { projectId, body } = await revisionDetailBytes(db, params.revisionId!);
  authorize(locals.user, { anyRole: READERS, projectId });
  // Bytes as the database wrote them (a Buffer is a Uint8Array; the DOM types want one over a plain ArrayBuffer).
  return new Response(body as Uint8Array<ArrayBuffer>, { headers: { 'Content-Type': 'application/json' } });
});
