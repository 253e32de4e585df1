// The Explore forms' field errors (`axes.1.toValue`, `windows.0.toM`: from the request schema or
// the server) placed beside the form field they belong to and said in words
// ("Second input — to value: …"). What belongs to no one field shows beside the form's button.

type FieldError = { field: string; message: string };
type Placed = { key: string; words: string };

/** Errors keyed by where they show, each led by its field in words; several on one place are joined, repeats dropped. */
function place(fields: ReadonlyArray<FieldError>, where: (path: string) => Placed): Record<string, string> {
  const out: Record<string, string> = {};
  for (const f of fields) {
    const { key, words } = where(f.field);
    const text = `${words}: ${f.message}`;
    if (out[key]?.includes(text)) continue;
    out[key] = out[key] ? `${out[key]} ${text}` : text;
  }
  return out;
}

const AXIS_WORDS = ['First input', 'Second input'];
const AXIS_FIELD_WORDS: Record<string, string> = { input: 'which input', fromValue: 'from value', toValue: 'to value', points: 'points' };

/** A sweep's paths: `axes.<n>.<field>` beside that field, anything else (`axes`) beside the grid count. */
export function sweepPlace(path: string): Placed {
  const m = /^axes\.(\d+)\.(\w+)/.exec(path);
  if (!m || !AXIS_FIELD_WORDS[m[2]]) return { key: 'axes', words: 'Grid' };
  return { key: `axes.${m[1]}.${m[2]}`, words: `${AXIS_WORDS[Number(m[1])] ?? `Input ${Number(m[1]) + 1}`} — ${AXIS_FIELD_WORDS[m[2]]}` };
}

/** A tornado's paths: one ± range serves every input, so each `inputs.<n>.plusMinusPct` is that field. */
export function tornadoPlace(path: string): Placed {
  if (/^inputs\.\d+\.plusMinusPct$/.test(path)) return { key: 'plusMinusPct', words: '± range' };
  const m = /^inputs\.(\d+)/.exec(path);
  return { key: 'form', words: m ? `Input ${Number(m[1]) + 1}` : 'Tornado' };
}

/** A placement's paths: the drum length, or the windows (numbered from 1, as typed). */
export function placementPlace(path: string): Placed {
  if (path === 'drumLengthM') return { key: 'drumLengthM', words: 'Drum length limit' };
  const m = /^windows\.(\d+)\.(fromM|toM)$/.exec(path);
  if (m) return { key: 'windows', words: `Window ${Number(m[1]) + 1} — ${m[2] === 'fromM' ? 'start' : 'end'}` };
  if (path.startsWith('windows')) return { key: 'windows', words: 'Windows' };
  return { key: 'form', words: path === 'bonding' ? 'Bonding' : 'Placement' };
}

export const sweepFieldErrors = (fields: ReadonlyArray<FieldError>) => place(fields, sweepPlace);
export const tornadoFieldErrors = (fields: ReadonlyArray<FieldError>) => place(fields, tornadoPlace);
export const placementFieldErrors = (fields: ReadonlyArray<FieldError>) => place(fields, placementPlace);

/** A zod failure's issues as the fields the server would name. */
export const issuesAsFields = (issues: ReadonlyArray<{ path: PropertyKey[]; message: string }>) => issues.map((i) => ({ field: i.path.map(String).join('.'), message: i.message }));
