import type { BondingStudyInput } from '../schemas/bonding-study.schema';

// Splitting, moving and removing route sections renumber the joints (joint k follows the k-th
// section). Every reference by joint number (SVLs, earthing overrides, internal faults, joint
// bay names, ECC transposition points) and by
// section id (ECC runs, bonding groups) is carried to the same physical joint or section; where
// none exists any more, the reference is changed and the change is said in words.

type Study = BondingStudyInput;
export interface SectionEdit {
  study: Study;
  /** What references changed, in words; empty when every one still points where it did. */
  notes: string[];
}

type JointMap = (joint: number) => { joint: number; note?: string };

function remapJoints(study: Study, map: JointMap): { study: Study; notes: string[] } {
  const notes: string[] = [];
  const at = (j: number, what: string) => {
    const m = map(j);
    if (m.note) notes.push(`${what} at joint ${j}: ${m.note}`);
    return m.joint;
  };
  const svls = (study.svls ?? []).map((s, i) => ({ ...s, jointIndex: at(s.jointIndex, `SVL ${i + 1}`) }));
  const overrides = (study.earthing.overrides ?? []).map((o) => ({ ...o, jointIndex: at(o.jointIndex, 'Earthing override') }));
  const cases = study.cases.map((c) =>
    c.internalFault?.jointIndex === undefined ? c : { ...c, internalFault: { ...c.internalFault, jointIndex: at(c.internalFault.jointIndex, `Internal fault of case ${c.id}`) } },
  );
  const eccs = study.eccs?.map((e) => (e.transposedAtJoints ? { ...e, transposedAtJoints: e.transposedAtJoints.map((j) => at(j, `Transposition point of ECC ${e.id}`)) } : e));
  const out: Study = { ...study, svls, earthing: { ...study.earthing, overrides }, cases };
  if (eccs) out.eccs = eccs;
  if (study.jointNames) {
    // A name goes with its joint bay; where two joints become one, the first name stays.
    const named = new Map<number, string>();
    for (const n of study.jointNames) {
      const j = at(n.jointIndex, `Joint bay ${n.name}`);
      if (named.has(j)) notes.push(`Joint bay ${n.name} is now the same joint as ${named.get(j)}: the name ${n.name} is dropped.`);
      else named.set(j, n.name);
    }
    out.jointNames = [...named].map(([jointIndex, name]) => ({ jointIndex, name }));
  }
  return { study: out, notes };
}

/** Splits section `index` into two halves (ids `<id>a`, `<id>b`); the new joint between them gets no references. */
export function splitSection(study: Study, index: number, newIds?: [string, string]): SectionEdit {
  const s = study.sections[index];
  const [idA, idB] = newIds ?? uniqueIds(study, [`${s.id}a`, `${s.id}b`]);
  const half = Number(s.lengthM) / 2;
  const sections = [...study.sections.slice(0, index), { ...s, id: idA, lengthM: half }, { ...s, id: idB, lengthM: half, phaseRotation: 0 as const }, ...study.sections.slice(index + 1)];
  // Joints after the split section move one on; the ones before it stay.
  const shifted = remapJoints(study, (j) => ({ joint: j > index ? j + 1 : j }));
  const notes = [...shifted.notes];
  const eccs = (shifted.study.eccs ?? []).map((e) => ({ ...e, fromSectionId: e.fromSectionId === s.id ? idA : e.fromSectionId, toSectionId: e.toSectionId === s.id ? idB : e.toSectionId }));
  const bonding = study.bonding.map((g, gi) => {
    if (!g.sectionIds.includes(s.id)) return g;
    if (g.kind === 'cross-bonded') notes.push(`Bonding group ${gi + 1} now has ${g.sectionIds.length + 1} minor sections: check that the cross-bonding still suits it.`);
    return { ...g, sectionIds: g.sectionIds.flatMap((id) => (id === s.id ? [idA, idB] : [id])) };
  });
  return { study: { ...shifted.study, sections, eccs, bonding }, notes };
}

/** Swaps section `index` with the next one; only the joint between them changes neighbours. */
export function moveSectionDown(study: Study, index: number): SectionEdit {
  const a = study.sections[index];
  const b = study.sections[index + 1];
  if (!b) return { study, notes: [] };
  const sections = [...study.sections];
  sections[index] = b;
  sections[index + 1] = a;
  const middle = index + 1;
  const moved = remapJoints(study, (j) => (j === middle ? { joint: j, note: `was between ${a.id} and ${b.id}, is now between ${b.id} and ${a.id}.` } : { joint: j }));
  const notes = [...moved.notes];
  const order = new Map(sections.map((s, i) => [s.id, i]));
  (study.eccs ?? []).forEach((e) => {
    if ((order.get(e.fromSectionId) ?? 0) > (order.get(e.toSectionId) ?? 0)) notes.push(`ECC ${e.id} now starts (${e.fromSectionId}) after it ends (${e.toSectionId}): give its run again.`);
  });
  return { study: { ...moved.study, sections }, notes };
}

/** Removes section `index`; the joints at its two ends become one, and references to it move to a neighbour. */
export function removeSection(study: Study, index: number): SectionEdit {
  const s = study.sections[index];
  const sections = study.sections.filter((_, i) => i !== index);
  const removed = remapJoints(study, (j) => {
    if (j <= index) return { joint: j };
    if (j === index + 1) return { joint: index, note: `the joint at the end of ${s.id} is merged with the one at its start (joint ${index}).` };
    return { joint: j - 1 };
  });
  const notes = [...removed.notes];
  const next = sections[index]?.id;
  const previous = sections[index - 1]?.id;
  const eccs = (removed.study.eccs ?? []).flatMap((e) => {
    let { fromSectionId, toSectionId } = e;
    if (fromSectionId === s.id && toSectionId === s.id) {
      notes.push(`ECC ${e.id} ran along ${s.id} only and is removed with it.`);
      return [];
    }
    if (fromSectionId === s.id && next) (fromSectionId = next), notes.push(`ECC ${e.id} now starts at ${next} (was ${s.id}).`);
    if (toSectionId === s.id && previous) (toSectionId = previous), notes.push(`ECC ${e.id} now ends at ${previous} (was ${s.id}).`);
    return [{ ...e, fromSectionId, toSectionId }];
  });
  const bonding = study.bonding.flatMap((g, gi) => {
    if (!g.sectionIds.includes(s.id)) return [g];
    const ids = g.sectionIds.filter((id) => id !== s.id);
    notes.push(ids.length ? `Bonding group ${gi + 1} loses ${s.id}.` : `Bonding group ${gi + 1} had only ${s.id} and is removed.`);
    return ids.length ? [{ ...g, sectionIds: ids }] : [];
  });
  return { study: { ...removed.study, sections, eccs, bonding }, notes };
}

function uniqueIds(study: Study, wanted: string[]): [string, string] {
  const taken = new Set(study.sections.map((s) => s.id));
  const free = (base: string) => {
    let id = base;
    for (let n = 2; taken.has(id); n++) id = `${base}${n}`;
    taken.add(id);
    return id;
  };
  return [free(wanted[0]), free(wanted[1])];
}
