import { authorize } from '../../../../../../lib/server/authorize';
import { endpoint } from '../../../../../../lib/server/http';
import { services } from '../../../../../../lib/server/services.server';
import { READERS } from '../../../../../../lib/server/scope';
import { AppError } from '../../../../../../lib/errors';
import { attachment } from '../../../../../../lib/server/attachment';
import { loadAsset } from '../../../../../../lib/register/assets.service';
import { loadEvidence } from '../../../../../../lib/register/obligations.service';

export const GET = endpoint(async ({ locals, params }) => {
  const s = await services();
  const asset = await loadAsset(s.db, params.assetId!);
  authorize(locals.user, { anyRole: READERS, projectId: asset.projectId });
  const record = await loadEvidence(s.db, params.recordId!);
  if (record.assetId !== asset.id) throw new AppError('NotFound', 'This record has no evidence file.');
  const bytes = await s.store!.get(record.evidenceKey!);
  return new Response(new Uint8Array(bytes), { headers: { 'content-type': record.evidenceType!, 'content-disposition': attachment(record.evidenceName!), 'x-file-sha256': record.evidenceSha256! } });
});
