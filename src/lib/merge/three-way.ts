// A three-way merge of JSON inputs: what I started from (base), what I have (mine) and what is
// stored now (theirs). A field changed on one side only takes that side; a field both changed
// differently is a conflict the person decides. Lists of equal length merge entry by entry;
// a list whose length changed on either side is one field (entries cannot be paired safely).

export interface MergeField {
  /** Dotted path ("sections.2.lengthM"); "" is the whole document. */
  path: string;
  base: unknown;
  mine: unknown;
  theirs: unknown;
  /** Both sides changed it, differently. */
  conflict: boolean;
}

export type Choice = 'mine' | 'theirs';

const isObject = (v: unknown): v is Record<string, unknown> => !!v && typeof v === 'object' && !Array.isArray(v);
export const sameJson = (a: unknown, b: unknown) => JSON.stringify(sortKeys(a)) === JSON.stringify(sortKeys(b));
function sortKeys(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(sortKeys);
  if (isObject(v)) return Object.fromEntries(Object.keys(v).sort().filter((k) => v[k] !== undefined).map((k) => [k, sortKeys(v[k])]));
  return v;
}

/** Every field that differs between the three, with whether it is a conflict. */
export function mergeFields(base: unknown, mine: unknown, theirs: unknown, path = ''): MergeField[] {
  if (sameJson(mine, theirs)) return [];
  const join = (k: string | number) => (path ? `${path}.${k}` : String(k));
  if (isObject(base) && isObject(mine) && isObject(theirs)) {
    const keys = new Set([...Object.keys(base), ...Object.keys(mine), ...Object.keys(theirs)]);
    return [...keys].flatMap((k) => mergeFields(base[k], mine[k], theirs[k], join(k)));
  }
  if (Array.isArray(base) && Array.isArray(mine) && Array.isArray(theirs) && base.length === mine.length && mine.length === theirs.length) {
    return base.flatMap((b, i) => mergeFields(b, mine[i], theirs[i], join(i)));
  }
  return [{ path, base, mine, theirs, conflict: !sameJson(base, mine) && !sameJson(base, theirs) }];
}

/**
 * The merged document: theirs, with each field set from the side chosen for it. A field changed
 * on one side only defaults to that side; a conflict defaults to mine.
 */
export function applyMerge(theirs: unknown, fields: MergeField[], choices: Record<string, Choice> = {}): unknown {
  let doc = structuredClone(theirs);
  for (const f of fields) {
    const side = choices[f.path] ?? defaultChoice(f);
    const value = side === 'mine' ? f.mine : f.theirs;
    doc = setAt(doc, f.path, structuredClone(value));
  }
  return doc;
}

export function defaultChoice(f: MergeField): Choice {
  if (f.conflict) return 'mine';
  return sameJson(f.base, f.mine) ? 'theirs' : 'mine';
}

function setAt(doc: unknown, path: string, value: unknown): unknown {
  if (path === '') return value;
  const keys = path.split('.');
  let o = doc as Record<string, unknown>;
  for (const k of keys.slice(0, -1)) o = o[k] as Record<string, unknown>;
  const last = keys[keys.length - 1];
  if (value === undefined) delete o[last];
  else o[last] = value;
  return doc;
}
