import { z } from 'zod';
import { AppError } from '../errors';
import { listQuerySchema } from '../schemas/revision-actions.schema';

const auditQuerySchema = listQuerySchema.extend({
  projectId: z.uuid().optional(),
  studyId: z.uuid().optional(),
  revisionId: z.uuid().optional(),
  studyCode: z.string().trim().min(1).max(40).optional(),
  revisionNumber: z.coerce.number().int().min(1).max(100_000).optional(),
  actorId: z.uuid().optional(),
  type: z.string().max(60).optional(),
  from: z.coerce.date().optional(),
  to: z.coerce.date().optional(),
});

/** The audit list's filters and page from the query string; a bad filter names its field. */
export function auditQuery(url: URL) {
  const parsed = auditQuerySchema.safeParse(Object.fromEntries(url.searchParams));
  if (!parsed.success) throw new AppError('InvalidInput', undefined, parsed.error.issues.map((i) => ({ field: i.path.join('.'), message: i.message })));
  return parsed.data;
}
