import { studySchema, describeIssues } from '../schemas/study.schema';
import { AppError } from '../errors';
import type { Study } from '../calc';

/** Validates study inputs with the shared schema; every failing field is named. */
export function parseStudyInputs(raw: unknown, kind: 'bonding' | 'exposure'): Study {
  const parsed = studySchema.safeParse(raw);
  if (!parsed.success) throw new AppError('InvalidInput', undefined, describeIssues(parsed.error).map((i) => ({ field: `inputs.${i.field}`, message: i.message })));
  if (parsed.data.kind !== kind) throw new AppError('InvalidInput', undefined, [{ field: 'inputs.kind', message: `This is a ${kind} study; the inputs describe a ${parsed.data.kind} study.` }]);
  return parsed.data;
}
