import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { serverConfig } from '../../../../lib/config.server';
import { PARTICIPANTS, READERS, projectOfRevision } from '../../../../lib/server/scope';
import { listFiles, uploadFile } from '../../../../lib/files/files.service';
import { receiveUpload } from '../../../../lib/files/upload-stream';
import { fileUploadSchema } from '../../../../lib/schemas/revision-actions.schema';
import { AppError } from '../../../../lib/errors';

export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(db, params.revisionId!) });
  return Response.json({ files: await listFiles(db, params.revisionId!) });
});

export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: PARTICIPANTS, projectId: await projectOfRevision(s.db, params.revisionId!) });
  const { fields, file } = await receiveUpload(request, serverConfig().UPLOAD_MAX_BYTES);
  const meta = fileUploadSchema.safeParse({ kind: fields.kind });
  if (!file) throw new AppError('InvalidInput', undefined, [{ field: 'file', message: 'Choose a file to upload.' }]);
  if (!meta.success) throw new AppError('InvalidInput', undefined, [{ field: 'kind', message: 'Say what the file is: data sheet, drawing, measurements or other.' }]);
  return Response.json(await uploadFile(s, user, params.revisionId!, { kind: meta.data.kind, fileName: file.name, bytes: file.bytes }, serverConfig().UPLOAD_MAX_BYTES), { status: 201 });
});
