import { create } from 'jsondiffpatch';
import { formatNumber } from '../format';
import { jointInWords } from '../calc/bonding/joint-names';

// The inputs of two revisions compared field by field and told in words ("section S2 length
// 500 m → 520 m"). jsondiffpatch finds the structural difference, matching list entries by
// their identifier so that a section inserted in the middle reads as one added section, not
// as every later section changed; this module only names what it found.

const differ = create({
  objectHash: (item: object, index?: number) => {
    const o = item as Record<string, unknown>;
    if (typeof o.id === 'string') return `id:${o.id}`;
    if (typeof o.jointIndex === 'number') return `joint:${o.jointIndex}`;
    if (typeof o.circuitId === 'string') return `circuit:${o.circuitId}`;
    if (typeof o.sourceId === 'string') return `source:${o.sourceId}`;
    return `#${index}`;
  },
  // Without a text-diff engine strings change whole (before → after), never by character.
  arrays: { detectMove: false },
});

/** What one entry of each list is called, singular. */
const ENTITY: Record<string, string> = {
  cableTypes: 'cable type',
  circuits: 'circuit',
  layouts: 'layout',
  sections: 'section',
  bonding: 'bonding group',
  eccs: 'ECC',
  svls: 'SVL',
  cases: 'case',
  currents: 'current',
  overrides: 'earthing',
  sources: 'source',
  positions: 'position',
  jointNames: 'joint name',
};

/** Field names in words, with their unit where the name carries one. */
const FIELD: Record<string, [string, string]> = {
  title: ['title', ''],
  name: ['name', ''],
  frequencyHz: ['frequency', 'Hz'],
  soilResistivityOhmM: ['soil resistivity', 'Ω·m'],
  lengthM: ['length', 'm'],
  layoutId: ['layout', ''],
  phaseRotation: ['cable transposition', ''],
  conductorResistanceOhmPerKm: ['conductor resistance', 'Ω/km'],
  conductorGmrMm: ['conductor GMR', 'mm'],
  sheathMeanDiameterMm: ['sheath mean diameter', 'mm'],
  sheathResistanceOhmPerKm: ['sheath resistance', 'Ω/km'],
  oversheathThicknessMm: ['oversheath thickness', 'mm'],
  overallDiameterMm: ['overall diameter', 'mm'],
  oversheathWithstandKv: ['oversheath withstand', 'kV'],
  ratingLossFactor: ['loss factor assumed in the rating', ''],
  cableTypeId: ['cable type', ''],
  formation: ['formation', ''],
  spacingM: ['spacing', 'm'],
  depthM: ['depth', 'm'],
  xM: ['x', 'm'],
  yM: ['y', 'm'],
  kind: ['kind', ''],
  sectionIds: ['sections', ''],
  earthedAt: ['earthed end', ''],
  routeStartOhm: ['route-start earth resistance', 'Ω'],
  routeEndOhm: ['route-end earth resistance', 'Ω'],
  linkBoxOhm: ['link-box earth resistance', 'Ω'],
  resistanceOhm: ['earth resistance', 'Ω'],
  resistanceOhmPerKm: ['resistance', 'Ω/km'],
  gmrMm: ['GMR', 'mm'],
  fromSectionId: ['first section', ''],
  toSectionId: ['last section', ''],
  transposedAtMidpoint: ['transposed mid-way', ''],
  transposedAtJoints: ['transposition points', ''],
  bondingLeadLength: ['bonding lead by length', ''],
  resistanceMilliohmPerM: ['resistance per metre', 'mΩ/m'],
  reactanceMilliohmPerM: ['reactance per metre', 'mΩ/m'],
  crossSectionMm2: ['cross-section', 'mm²'],
  material: ['material', ''],
  connection: ['connection', ''],
  continuousRatingV: ['continuous rating', 'V'],
  tovRatingV: ['TOV capability', 'V'],
  currentA: ['current', 'A'],
  angleDeg: ['angle', '°'],
  durationS: ['duration', 's'],
  phase: ['faulted phase', ''],
  beyond: ['fault beyond the', ''],
  circuitId: ['circuit', ''],
  earthFault: ['earth fault', ''],
  bondingLeadMilliohm: ['bonding lead impedance', ''],
  r: ['resistance', 'mΩ'],
  x: ['reactance', 'mΩ'],
  earthing: ['earthing', ''],
  touch: ['touch-voltage data', ''],
  bodyWeightKg: ['body weight', 'kg'],
  surfaceLayer: ['surface layer', ''],
  thicknessM: ['thickness', 'm'],
  resistivityOhmM: ['resistivity', 'Ω·m'],
  object: ['exposed metalwork', ''],
  parallelLengthM: ['parallel length', 'm'],
  earthStartOhm: ['start earth resistance', 'Ω'],
  earthEndOhm: ['end earth resistance', 'Ω'],
  screeningFactor: ['screening factor', ''],
  jointIndex: ['joint', ''],
  sourceId: ['source', ''],
};

const fieldName = (key: string): [string, string] => FIELD[key] ?? [key.replace(/([A-Z])/g, ' $1').toLowerCase(), ''];

/** A value in words: numbers to four significant figures with the unit, lists joined. */
export function valueText(value: unknown, unit = ''): string {
  if (value === undefined || value === null) return 'none';
  if (typeof value === 'number') return unit ? `${formatNumber(value)} ${unit}` : formatNumber(value);
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return value;
  if (Array.isArray(value)) return value.every((v) => typeof v !== 'object' || v === null) ? value.map((v) => valueText(v)).join(', ') || 'none' : `${value.length} entries`;
  return Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => typeof v !== 'object' || v === null)
    .map(([k, v]) => `${fieldName(k)[0]} ${valueText(v, fieldName(k)[1])}`)
    .join(', ');
}

/** Joint names to tell joints by ("joint bay JB-3 (joint 3)"): the later revision's, else the earlier's. */
type Names = { jointNames?: Array<{ jointIndex: number; name: string }> };

/** How an entry of a list is named: "section S2", "SVL at joint 4", "bonding group 2". */
function entryName(listKey: string, item: unknown, index: number, names: Names): string {
  const o = (item ?? {}) as Record<string, unknown>;
  const what = ENTITY[listKey] ?? listKey;
  if (listKey === 'svls') return `SVL at ${jointInWords(names, Number(o.jointIndex))}`;
  if (listKey === 'overrides') return `earthing at ${jointInWords(names, Number(o.jointIndex))}`;
  if (listKey === 'jointNames') return `joint ${o.jointIndex}`;
  if (listKey === 'currents') return o.circuitId ? `circuit ${o.circuitId}` : `source ${o.sourceId}`;
  if (listKey === 'circuits' && typeof o.circuitId === 'string') return `circuit ${o.circuitId}`;
  if (typeof o.id === 'string') return `${what} ${o.id}`;
  return `${what} ${index + 1}`;
}

const isPlainList = (v: unknown) => Array.isArray(v) && v.every((x) => typeof x !== 'object' || x === null);

type Delta = Record<string, unknown> | unknown[];

/** Every input that differs between `before` and `after`, as sentences, in the order of the study. */
export function describeInputChanges(before: unknown, after: unknown): string[] {
  const delta = differ.diff(before, after) as Delta | undefined;
  if (!delta) return [];
  const out: string[] = [];
  const names: Names = { jointNames: (after as Names | undefined)?.jointNames ?? (before as Names | undefined)?.jointNames };
  walk(delta, before, after, [], out, names);
  return out;
}

/** An ECC's transposition joints in words, "none" when it has none. */
const crossingsText = (joints: unknown, names: Names) =>
  Array.isArray(joints) && joints.length ? [...joints].sort((p, q) => p - q).map((j) => jointInWords(names, j)).join(', ') : 'none';

function walk(delta: Delta, before: unknown, after: unknown, subject: string[], out: string[], names: Names): void {
  if (Array.isArray(delta)) {
    leaf(delta, subject, '', out);
    return;
  }
  if ((delta as Record<string, unknown>)._t === 'a') {
    list(delta as Record<string, unknown>, before as unknown[], after as unknown[], subject, out, '', names);
    return;
  }
  for (const [key, d] of Object.entries(delta)) {
    const b = (before as Record<string, unknown> | undefined)?.[key];
    const a = (after as Record<string, unknown> | undefined)?.[key];
    const [name, unit] = fieldName(key);
    if (key === 'transposedAtJoints') {
      // An empty list and none read the same ("none"): no sentence for a change nobody could see.
      const [was, now] = [crossingsText(b, names), crossingsText(a, names)];
      if (was !== now) out.push(sentence([...subject, name], `${was} → ${now}`));
    } else if (isPlainList(b) && isPlainList(a)) {
      // A list of plain values (the sections of a bonding group) reads best whole.
      out.push(sentence([...subject, name], `${valueText(b)} → ${valueText(a)}`));
    } else if (Array.isArray(d) && (Array.isArray(a) || Array.isArray(b))) {
      // A whole list given or taken away (joint names, a first override) reads entry by entry.
      const whole = differ.diff(b ?? [], a ?? []) as Record<string, unknown> | undefined;
      if (whole) list(whole, (b ?? []) as unknown[], (a ?? []) as unknown[], subject, out, key, names);
    } else if (Array.isArray(d)) {
      leaf(d, [...subject, name], unit, out);
    } else if ((d as Record<string, unknown>)._t === 'a') {
      list(d as Record<string, unknown>, (b ?? []) as unknown[], (a ?? []) as unknown[], subject.length ? subject : [], out, key, names);
    } else {
      walk(d as Delta, b, a, [...subject, name], out, names);
    }
  }
}

function list(delta: Record<string, unknown>, before: unknown[], after: unknown[], subject: string[], out: string[], listKey: string, names: Names): void {
  const removed: string[] = [];
  const added: string[] = [];
  const changed: Array<() => void> = [];
  for (const [k, d] of Object.entries(delta)) {
    if (k === '_t') continue;
    if (k.startsWith('_')) {
      const i = Number(k.slice(1));
      const [old, , type] = d as unknown[];
      const o = old as Record<string, unknown>;
      if (type === 0) removed.push(sentence([...subject, entryName(listKey, old, i, names)], listKey === 'jointNames' ? `no longer named ${o?.name}` : 'removed'));
      continue;
    }
    const i = Number(k);
    if (Array.isArray(d) && d.length === 1) {
      const summary = valueText(d[0]);
      const named = listKey === 'jointNames' ? `named ${(d[0] as Record<string, unknown>).name}` : `added${summary ? ` (${summary})` : ''}`;
      added.push(sentence([...subject, entryName(listKey, d[0], i, names)], named));
    } else {
      const afterItem = after[i];
      const beforeItem = before.find((x) => sameEntry(x, afterItem)) ?? before[i];
      changed.push(() => walk(d as Delta, beforeItem, afterItem, [...subject, entryName(listKey, afterItem, i, names)], out, names));
    }
  }
  changed.forEach((f) => f());
  out.push(...removed, ...added);
}

const sameEntry = (a: unknown, b: unknown) => {
  const x = a as Record<string, unknown> | null;
  const y = b as Record<string, unknown> | null;
  if (!x || !y) return false;
  for (const k of ['id', 'jointIndex', 'circuitId', 'sourceId']) if (x[k] !== undefined && x[k] === y[k]) return true;
  return false;
};

function leaf(d: unknown[], subject: string[], unit: string, out: string[]): void {
  if (d.length === 1) out.push(sentence(subject, `set to ${valueText(d[0], unit)}`));
  else if (d.length === 2) out.push(sentence(subject, `${valueText(d[0], unit)} → ${valueText(d[1], unit)}`));
  else if (d.length === 3 && d[2] === 0) out.push(sentence(subject, `${valueText(d[0], unit)} removed`));
}

const sentence = (subject: string[], text: string) => `${subject.join(' ')} ${text}`.trim();
