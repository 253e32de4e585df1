import type { FieldError } from '../errors';

// U+0000 cannot be stored in PostgreSQL text or jsonb, and a lone UTF-16 surrogate is not a
// character at all: both are refused at the door, naming the field, before anything is written.
const UNSTORABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Every string (value or key) in a parsed JSON body that the database could not store. */
export function unstorableText(value: unknown, path: string[] = [], found: FieldError[] = []): FieldError[] {
  const field = () => path.join('.') || '(body)';
  if (typeof value === 'string') {
    if (UNSTORABLE.test(value)) found.push({ field: field(), message: 'Remove the control character (U+0000) or the broken character from this text.' });
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => unstorableText(v, [...path, String(i)], found));
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      if (UNSTORABLE.test(k)) found.push({ field: field(), message: 'A field name holds a control character (U+0000) or a broken character.' });
      else unstorableText(v, [...path, k], found);
    }
  }
  return found.slice(0, 20);
}
