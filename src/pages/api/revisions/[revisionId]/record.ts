import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../lib/server/scope';
import { DOCX_TYPE, recordForDownload } from '../../../../lib/records/records.service';

export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(db, params.revisionId!) });
  const record = await recordForDownload(db, params.revisionId!);
  if (record.kind === 'rendering') {
    return Response.json({ status: 'rendering', message: 'The issued record is being rendered; try again in a few seconds.' }, { status: 202, headers: { 'retry-after': '2' } });
  }
  return new Response(new Uint8Array(record.document), {
    headers: {
      'content-type': DOCX_TYPE,
      'content-disposition': `attachment; filename="${record.fileName}"`,
      'x-record-sha256': record.sha256,
      'x-record-draft': String(record.draft),
    },
  });
});
