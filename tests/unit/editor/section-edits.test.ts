import { describe, expect, it } from 'vitest';
import { moveSectionDown, removeSection, splitSection } from '../../../src/lib/route-edits/section-edits';
import { defaultBondingInputs } from '../../../src/lib/studies/default-inputs';
import type { BondingStudyInput } from '../../../src/lib/schemas/bonding-study.schema';

// Joint numbering (this project's schema, svlSchema.jointIndex): joint 0 is the route start,
// joint k follows the k-th section. A reference must stay on the same physical joint, i.e.
// between the same two section ids, after every edit.

function study(): BondingStudyInput {
  const s = defaultBondingInputs('t');
  s.sections = ['S1', 'S2', 'S3', 'S4', 'S5', 'S6'].map((id) => ({ id, lengthM: 400, layoutId: 'L1', phaseRotation: 0 as const }));
  s.bonding = [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }, { kind: 'cross-bonded', sectionIds: ['S4', 'S5', 'S6'] }];
  s.eccs = [{ id: 'E1', name: 'ECC', resistanceOhmPerKm: 0.1, gmrMm: 8, fromSectionId: 'S2', toSectionId: 'S5', transposedAtMidpoint: false }];
  s.svls = [1, 2, 4, 5].map((jointIndex) => ({ jointIndex, connection: 'to-earth' as const, continuousRatingV: 3000, tovRatingV: 6000 }));
  s.earthing.overrides = [{ jointIndex: 3, resistanceOhm: 2 }];
  s.cases.push({ id: 'IF', name: 'internal', kind: 'internal-fault', durationS: 0.5, internalFault: { circuitId: 'C1', phase: 'a', jointIndex: 4 } });
  return s;
}
/** The two section ids either side of a joint: what makes it the same joint physically. */
const neighbours = (s: BondingStudyInput, j: number) => `${s.sections[j - 1]?.id ?? 'start'}|${s.sections[j]?.id ?? 'end'}`;
const svlJoints = (s: BondingStudyInput) => (s.svls ?? []).map((x) => neighbours(s, x.jointIndex));

describe('section edits keep references on the same joints', () => {
  it('split: SVLs, overrides and the internal fault after the split move one joint on; ECC ends follow', () => {
    const before = study();
    const { study: after, notes } = splitSection(before, 1);
    expect(after.sections.map((s) => s.id)).toEqual(['S1', 'S2a', 'S2b', 'S3', 'S4', 'S5', 'S6']);
    expect(after.sections[1].lengthM + after.sections[2].lengthM).toBe(400);
    // S2's end joint was between S2 and S3; it is now between S2b and S3.
    expect(svlJoints(after)).toEqual(['S1|S2a', 'S2b|S3', 'S4|S5', 'S5|S6']);
    expect(after.svls!.map((x) => x.jointIndex)).toEqual([1, 3, 5, 6]);
    expect(after.earthing.overrides![0].jointIndex).toBe(4);
    expect(neighbours(after, after.earthing.overrides![0].jointIndex)).toBe('S3|S4');
    expect(after.cases.at(-1)!.internalFault!.jointIndex).toBe(5);
    expect(after.eccs![0]).toMatchObject({ fromSectionId: 'S2a', toSectionId: 'S5' });
    expect(after.bonding[0].sectionIds).toEqual(['S1', 'S2a', 'S2b', 'S3']);
    expect(notes.join(' ')).toMatch(/Bonding group 1 now has 4 minor sections/);
  });

  it('remove: joints after the removed section move back; the merged joint and the ECC end are said', () => {
    const { study: after, notes } = removeSection(study(), 4); // S5
    expect(after.sections.map((s) => s.id)).toEqual(['S1', 'S2', 'S3', 'S4', 'S6']);
    expect(after.svls!.map((x) => x.jointIndex)).toEqual([1, 2, 4, 4]);
    expect(neighbours(after, 4)).toBe('S4|S6');
    expect(after.eccs![0]).toMatchObject({ fromSectionId: 'S2', toSectionId: 'S4' });
    expect(after.bonding[1].sectionIds).toEqual(['S4', 'S6']);
    expect(notes).toEqual(expect.arrayContaining([expect.stringMatching(/SVL 4 at joint 5: the joint at the end of S5 is merged/), expect.stringMatching(/ECC E1 now ends at S4 \(was S5\)/), expect.stringMatching(/Bonding group 2 loses S5/)]));
  });

  it('move: only references at the joint between the two swapped sections are reported', () => {
    const { study: after, notes } = moveSectionDown(study(), 3); // S4 ↔ S5, joint 4 between them
    expect(after.sections.map((s) => s.id)).toEqual(['S1', 'S2', 'S3', 'S5', 'S4', 'S6']);
    expect(after.svls!.map((x) => x.jointIndex)).toEqual([1, 2, 4, 5]);
    expect(notes).toHaveLength(2);
    expect(notes[0]).toMatch(/SVL 3 at joint 4: was between S4 and S5, is now between S5 and S4/);
    expect(notes[1]).toMatch(/Internal fault of case IF/);
  });

  it('an edit with nothing to report says nothing, and leaves the input untouched', () => {
    const s = study();
    const copy = structuredClone(s);
    const { notes } = splitSection(s, 5);
    expect(s).toEqual(copy);
    expect(notes).toEqual(['Bonding group 2 now has 4 minor sections: check that the cross-bonding still suits it.']);
  });
});

describe('section edits keep joint bay names and ECC transposition points on the same joints', () => {
  function named(): BondingStudyInput {
    const s = study();
    s.jointNames = [{ jointIndex: 2, name: 'Mill Lane' }, { jointIndex: 3, name: 'Bay 3' }, { jointIndex: 4, name: 'Ford' }];
    s.eccs![0] = { ...s.eccs![0], transposedAtJoints: [3, 4] };
    return s;
  }
  const namesAt = (s: BondingStudyInput) => Object.fromEntries((s.jointNames ?? []).map((n) => [n.name, neighbours(s, n.jointIndex)]));
  const crossingsAt = (s: BondingStudyInput) => s.eccs![0].transposedAtJoints!.map((j) => neighbours(s, j));

  it('split, move and remove carry names and crossings with their joints', () => {
    const before = named();
    const places = namesAt(before);
    const crossings = crossingsAt(before);
    const split = splitSection(before, 1).study;
    expect(namesAt(split)).toEqual({ 'Mill Lane': 'S2b|S3', 'Bay 3': places['Bay 3'], Ford: places.Ford });
    expect(crossingsAt(split)).toEqual(crossings);
    // Swapping S3 and S4 keeps joint numbers; the joint between them is said to have new neighbours.
    const moved = moveSectionDown(before, 2);
    expect(moved.study.jointNames).toEqual(before.jointNames);
    expect(moved.study.eccs![0].transposedAtJoints).toEqual([3, 4]);
    expect(moved.notes).toContain('Joint bay Bay 3 at joint 3: was between S3 and S4, is now between S4 and S3.');
    const removed = removeSection(before, 0).study;
    expect(namesAt(removed)).toEqual(places);
    expect(crossingsAt(removed)).toEqual(crossings);
  });

  it('when two named joints become one, the first name stays and the edit says so', () => {
    const { study: after, notes } = removeSection(named(), 2);
    expect(after.jointNames).toEqual([{ jointIndex: 2, name: 'Mill Lane' }, { jointIndex: 3, name: 'Ford' }]);
    expect(notes).toContain('Joint bay Bay 3 is now the same joint as Mill Lane: the name Bay 3 is dropped.');
    expect(after.eccs![0].transposedAtJoints).toEqual([2, 3]);
  });

  it('leaves a study without names or crossings without those keys', () => {
    const { study: after } = splitSection(study(), 2);
    expect('jointNames' in after).toBe(false);
    expect('transposedAtJoints' in after.eccs![0]).toBe(false);
  });
});
