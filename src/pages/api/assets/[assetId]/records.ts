import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { serverConfig } from '../../../../lib/config.server';
import { PARTICIPANTS } from '../../../../lib/server/scope';
import { AppError } from '../../../../lib/errors';
import { receiveUpload } from '../../../../lib/files/upload-stream';
import { projectOfAsset } from '../../../../lib/register/assets.service';
import { recordObligation } from '../../../../lib/register/obligations.service';
import { obligationRecordSchema } from '../../../../lib/schemas/register.schema';
import { unstorableText } from '../../../../lib/server/storable-text';

/** Records an obligation done: multipart fields (obligationTypeId, doneOn, performedBy, values, remarks) and an optional evidence file. */
export const POST = endpoint(async ({ locals, params, request }) => {
  const s = await services();
  const user = authorize(locals.user, { anyRole: PARTICIPANTS, projectId: await projectOfAsset(s.db, params.assetId!) });
  const maxBytes = serverConfig().UPLOAD_MAX_BYTES;
  const { fields, file } = await receiveUpload(request, maxBytes);
  const unstorable = unstorableText(fields);
  if (unstorable.length) throw new AppError('InvalidInput', undefined, unstorable);
  const parsed = obligationRecordSchema.safeParse(fields);
  if (!parsed.success) throw new AppError('InvalidInput', undefined, parsed.error.issues.map((i) => ({ field: i.path.join('.') || '(body)', message: i.message })));
  return Response.json(await recordObligation(s, user, params.assetId!, parsed.data, file ? { fileName: file.name, bytes: file.bytes } : null, maxBytes), { status: 201 });
});
