import { describe, expect, it } from 'vitest';
import { bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';
import { describeIssues } from '../../../src/lib/schemas/study.schema';
import { EARTH, FloatingNodesError, NetworkBuilder, crossSectionCoupling } from '../../../src/lib/calc/network';
import { referenceStudyInput, sections } from '../../helpers/reference-study';

function issuesOf(input: unknown) {
  const parsed = bondingStudySchema.safeParse(input);
  expect(parsed.success).toBe(false);
  return parsed.success ? [] : describeIssues(parsed.error);
}

describe('bad input is rejected field by field', () => {
  it('cables that overlap (spacing below the overall diameter)', () => {
    const issues = issuesOf(referenceStudyInput({ spacingM: 0.09 }));
    expect(issues).toContainEqual({ field: 'layouts.0.circuits.0.spacingM', message: expect.stringContaining('overlap') });
  });

  it('two circuits placed on top of each other', () => {
    const input = referenceStudyInput();
    input.circuits!.push({ id: 'C2', name: 'two', cableTypeId: 'REF' });
    input.layouts![0].circuits.push({ circuitId: 'C2', formation: 'trefoil', spacingM: 0.11, depthM: 1.2, centreXM: 0.05 });
    expect(issuesOf(input).some((i) => i.field === 'layouts.0.circuits' && i.message.includes('overlap'))).toBe(true);
  });

  it('zero and negative lengths', () => {
    const issues = issuesOf(referenceStudyInput({ sections: [{ id: 'S1', lengthM: 0, layoutId: 'L' }] }));
    expect(issues).toContainEqual({ field: 'sections.0.lengthM', message: 'Section length must be greater than zero.' });
    expect(issuesOf(referenceStudyInput({ sections: [{ id: 'S1', lengthM: -5, layoutId: 'L' }] }))[0].field).toBe('sections.0.lengthM');
  });

  it('a cross-bonded major section without three minor sections', () => {
    const issues = issuesOf(referenceStudyInput({ sections: sections(500, 500), bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2'] }] }));
    expect(issues).toContainEqual({ field: 'bonding.0.sectionIds', message: expect.stringContaining('exactly three minor sections; this one has 2') });
  });

  it('sections left without a bonding arrangement, or out of order', () => {
    expect(issuesOf(referenceStudyInput({ sections: sections(500, 500), bonding: [{ kind: 'solid', sectionIds: ['S1'] }] }))).toContainEqual({
      field: 'bonding',
      message: expect.stringContaining('no bonding arrangement'),
    });
    expect(issuesOf(referenceStudyInput({ sections: sections(500, 500), bonding: [{ kind: 'solid', sectionIds: ['S2', 'S1'] }] }))[0].message).toContain('out of route order');
  });

  it('an SVL where no open sheath end exists', () => {
    const issues = issuesOf(
      referenceStudyInput({
        bonding: [{ kind: 'solid', sectionIds: ['S1'] }],
        svls: [{ jointIndex: 1, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 }],
      }),
    );
    expect(issues).toContainEqual({ field: 'svls.0.jointIndex', message: expect.stringContaining('no open sheath end') });
  });

  it('an SVL at an open end is accepted', () => {
    const ok = bondingStudySchema.safeParse(referenceStudyInput({ svls: [{ jointIndex: 1, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 }] }));
    expect(ok.success).toBe(true);
  });

  it('a fault in a phase or circuit that does not exist', () => {
    const fault = (earthFault: Record<string, unknown>) =>
      referenceStudyInput({ cases: [{ id: 'F', name: 'f', kind: 'earth-fault', durationS: 1, earthFault: earthFault as never }] });
    expect(issuesOf(fault({ circuitId: 'C1', phase: 'd', currentA: 1000 }))[0].field).toBe('cases.0.earthFault.phase');
    expect(issuesOf(fault({ circuitId: 'C9', phase: 'a', currentA: 1000 }))).toContainEqual({
      field: 'cases.0.earthFault.circuitId',
      message: expect.stringContaining('No circuit "C9"'),
    });
  });

  it('a fault case without its duration', () => {
    const issues = issuesOf(referenceStudyInput({ cases: [{ id: 'F', name: 'f', kind: 'three-phase-fault', currents: [{ circuitId: 'C1', currentA: 20000 }] }] }));
    expect(issues).toContainEqual({ field: 'cases.0.durationS', message: expect.stringContaining('duration') });
  });

  it('references to things that do not exist', () => {
    const issues = issuesOf(referenceStudyInput({ sections: [{ id: 'S1', lengthM: 500, layoutId: 'NOPE' }] }));
    expect(issues).toContainEqual({ field: 'sections.0.layoutId', message: expect.stringContaining('No layout "NOPE"') });
  });
});

describe('an unsolvable network is an error that says why', () => {
  it('a node with no path to earth is named', () => {
    const builder = new NetworkBuilder();
    const a = builder.addNode(0, 'sheath at the start');
    const b = builder.addNode(1, 'sheath at the end');
    builder.addSegment([a], [b], 100, crossSectionCoupling([[{ re: 1e-4, im: 5e-5 }]], [], []));
    expect(() => builder.compile()).toThrow(FloatingNodesError);
    expect(() => builder.compile()).toThrow(/sheath at the start/);
    builder.addAdmittance(a, EARTH, { re: 1, im: 0 });
    expect(() => builder.compile()).not.toThrow();
  });
});
