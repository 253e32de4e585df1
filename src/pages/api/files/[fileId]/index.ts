import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../lib/server/scope';
import { loadFile } from '../../../../lib/files/files.service';
import { assertId } from '../../../../lib/db/revisions.repo';
import { attachment } from '../../../../lib/server/attachment';

export const GET = endpoint(async ({ locals, params }) => {
  const s = await services();
  const file = await loadFile(s.db, assertId(params.fileId, 'file'));
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(s.db, file.revisionId) });
  const bytes = await s.store!.get(file.storageKey);
  return new Response(new Uint8Array(bytes), {
    headers: { 'content-type': file.contentType, 'content-disposition': attachment(file.fileName), 'x-file-sha256': file.sha256 },
  });
});
