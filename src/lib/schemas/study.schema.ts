import { z } from 'zod';
import './plain-messages';
import { bondingStudySchema } from './bonding-study.schema';
import { exposureStudySchema } from './exposure-study.schema';

/** Any study the core calculates, told apart by `kind`. */
export const studySchema = z.discriminatedUnion('kind', [bondingStudySchema, exposureStudySchema]);

export type StudyInput = z.input<typeof studySchema>;

/** The JSON Schema of a study's input, generated from the zod schema (cross-field rules are not expressible there). */
export const studyJsonSchema = () => z.toJSONSchema(studySchema, { io: 'input', unrepresentable: 'any' });

/**
 * Field-by-field messages for a failed parse: "sections.2.lengthM: Section length must be
 * greater than zero." An unknown key is named as a field of its own, so a misspelt flag is
 * found, not silently dropped.
 */
export function describeIssues(error: z.ZodError): Array<{ field: string; message: string }> {
  return error.issues.flatMap((i) =>
    i.code === 'unrecognized_keys'
      ? i.keys.map((key) => ({
          field: [...i.path, key].join('.'),
          message: `Unknown field "${key}": check its spelling; a study has no such field here.`,
        }))
      : [{ field: i.path.join('.') || '(study)', message: i.message }],
  );
}
