// A sweep's field errors (`axes.1.toValue`, from the schema or the server) placed beside the form
// field they belong to and said in words ("Second input — to value").

const AXIS_WORDS = ['First input', 'Second input'];
const FIELD_WORDS: Record<string, string> = { input: 'which input', fromValue: 'from value', toValue: 'to value', points: 'points' };

/** The form field an error path belongs beside: `axes.<n>.<field>`, or `axes` for the grid as a whole. */
export function sweepFieldKey(path: string): string {
  const m = /^axes\.(\d+)\.(\w+)/.exec(path);
  if (m && FIELD_WORDS[m[2]]) return `axes.${m[1]}.${m[2]}`;
  return 'axes';
}

/** "First input — from value", "Second input — points"; "Grid" for the sweep as a whole. */
export function sweepFieldWords(key: string): string {
  const m = /^axes\.(\d+)\.(\w+)$/.exec(key);
  if (!m) return 'Grid';
  return `${AXIS_WORDS[Number(m[1])] ?? `Input ${Number(m[1]) + 1}`} — ${FIELD_WORDS[m[2]]}`;
}

/** Field errors keyed by where they show, each message led by its field in words; several on one field are joined. */
export function sweepFieldErrors(fields: ReadonlyArray<{ field: string; message: string }>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const f of fields) {
    const key = sweepFieldKey(f.field);
    const text = `${sweepFieldWords(key)}: ${f.message}`;
    out[key] = out[key] ? `${out[key]} ${text}` : text;
  }
  return out;
}
