import { z } from 'zod';

// A record's document number is built from a per-project pattern. Placeholders:
// {project} the project code, {study} the study code, {revision} the revision number,
// {revision:N} the revision number padded with zeros to N digits.

export const DEFAULT_DOCUMENT_NUMBER_PATTERN = '{project}-{study}-R{revision:2}';

const PLACEHOLDER = /\{(project|study|revision)(?::(\d))?\}/g;

export const documentNumberPatternSchema = z.object({
  pattern: z
    .string()
    .trim()
    .min(1, 'Give a pattern, for example {project}-{study}-R{revision:2}.')
    .max(80, 'Keep the pattern within 80 characters.')
    .refine((p) => !/\{(?!(project|study|revision)(:\d)?\})/.test(p), 'Use only the placeholders {project}, {study}, {revision} and {revision:N}.')
    // Without the study and revision two records would share a number.
    .refine((p) => p.includes('{study}') && /\{revision(:\d)?\}/.test(p), 'The pattern must contain {study} and {revision}, so that every record has its own number.')
    // The number becomes part of a file name.
    .refine((p) => !/[\\/:*?"<>|\u0000-\u001f]/.test(p.replace(PLACEHOLDER, '')), 'The pattern may not contain \\ / : * ? " < > | or control characters (it becomes part of the file name).'),
});

/** The document number of one revision's record. */
export function documentNumber(pattern: string | null | undefined, v: { project: string; study: string; revision: number }): string {
  return (pattern || DEFAULT_DOCUMENT_NUMBER_PATTERN).replace(PLACEHOLDER, (_, name: 'project' | 'study' | 'revision', width?: string) =>
    name === 'revision' ? String(v.revision).padStart(Number(width ?? 0), '0') : v[name],
  );
}
