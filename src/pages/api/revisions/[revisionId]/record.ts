import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../lib/server/scope';
import { attachment } from '../../../../lib/server/attachment';
import { AppError } from '../../../../lib/errors';
import { DOCX_TYPE, recordForDownload, retryIssuedRecord } from '../../../../lib/records/records.service';

export const GET = endpoint(async ({ locals, params }) => {
  const { db, store, appUrl } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(db, params.revisionId!) });
  const record = await recordForDownload(db, params.revisionId!, store, appUrl);
  if (record.kind === 'rendering') {
    return Response.json({ status: 'rendering', message: 'The issued record is being rendered; try again in a few seconds.' }, { status: 202, headers: { 'retry-after': '2' } });
  }
  if (record.kind === 'failed') {
    throw new AppError('RecordFailed', `The issued record could not be rendered: ${record.error} An approver can render it again once the cause is fixed.`);
  }
  return new Response(new Uint8Array(record.document), {
    headers: {
      'content-type': DOCX_TYPE,
      'content-disposition': attachment(record.fileName),
      'x-record-sha256': record.sha256,
      'x-record-draft': String(record.draft),
    },
  });
});

/** Renders a failed issued record again (an approver of the project, after fixing the cause). */
export const POST = endpoint(async ({ locals, params }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: ['approver'], projectId: await projectOfRevision(s.db, params.revisionId!) });
  await retryIssuedRecord(s, user, params.revisionId!);
  return Response.json({ status: 'rendering', message: 'The record is being rendered again.' }, { status: 202 });
});
