import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { bondingStudySchema, STUDY_LIMITS } from '../../../src/lib/schemas/bonding-study.schema';
import { describeIssues, studySchema } from '../../../src/lib/schemas/study.schema';
import { NetworkBuilder, EARTH, crossSectionCoupling } from '../../../src/lib/calc/network';
import { earthReturnDepthM } from '../../../src/lib/calc/earth-return';
import { referenceStudyInput, sections } from '../../helpers/reference-study';

// Issue 10 §6: input the core must refuse, with the field named and nothing computed.

function issuesOf(input: unknown) {
  const parsed = studySchema.safeParse(input);
  expect(parsed.success).toBe(false);
  return parsed.success ? [] : describeIssues(parsed.error);
}

describe('unknown keys anywhere are refused, naming the field', () => {
  it('a misspelt flag on a case', () => {
    const input = referenceStudyInput();
    (input.cases![0] as Record<string, unknown>).svlsConduting = true;
    expect(issuesOf(input)).toContainEqual({ field: 'cases.0.svlsConduting', message: expect.stringContaining('Unknown field "svlsConduting"') });
  });

  it('at the top level, in earthing and inside a layout placement', () => {
    const input = referenceStudyInput() as Record<string, any>;
    input.soilResistivity = 100;
    input.earthing.linkboxOhm = 5;
    input.layouts[0].circuits[0].spacing = 0.2;
    const fields = issuesOf(input).map((i) => i.field);
    expect(fields).toEqual(expect.arrayContaining(['soilResistivity', 'earthing.linkboxOhm', 'layouts.0.circuits.0.spacing']));
  });

  it('in an exposure study', () => {
    const fence = JSON.parse(readFileSync('tests/fixtures/studies/marrow-lane-fence-exposure.json', 'utf8'));
    fence.object.earthStartOhms = 3;
    expect(issuesOf(fence)).toContainEqual({ field: 'object.earthStartOhms', message: expect.stringContaining('Unknown field') });
  });

  it('stored inputs of existing revisions still parse (the fixtures the demo seeds from)', () => {
    for (const name of ['fernhollow-cross-bonded', 'kestrel-single-point-ecc', 'marrow-lane-fence-exposure']) {
      expect(studySchema.safeParse(JSON.parse(readFileSync(`tests/fixtures/studies/${name}.json`, 'utf8'))).success, name).toBe(true);
    }
  });
});

describe('sizes beyond the stated limits are refused, naming the field', () => {
  it(`more than ${STUDY_LIMITS.sections} sections`, () => {
    const n = STUDY_LIMITS.sections + 1;
    const input = referenceStudyInput({ sections: sections(...Array<number>(n).fill(10)), bonding: [{ kind: 'solid', sectionIds: Array.from({ length: n }, (_, i) => `S${i + 1}`) }] });
    expect(issuesOf(input)).toContainEqual({ field: 'sections', message: `At most ${STUDY_LIMITS.sections} route sections; split the study.` });
  });

  it(`more than ${STUDY_LIMITS.cases} cases`, () => {
    const cases = Array.from({ length: STUDY_LIMITS.cases + 1 }, (_, i) => ({ id: `N${i}`, name: 'n', kind: 'normal' as const, currents: [{ circuitId: 'C1', currentA: 100 }] }));
    expect(issuesOf(referenceStudyInput({ cases }))).toContainEqual({ field: 'cases', message: `At most ${STUDY_LIMITS.cases} cases; split the study.` });
  });

  it(`more than ${STUDY_LIMITS.sectionCases} sections × cases`, () => {
    const n = 1000;
    const cases = Array.from({ length: 21 }, (_, i) => ({ id: `N${i}`, name: 'n', kind: 'normal' as const, currents: [{ circuitId: 'C1', currentA: 100 }] }));
    const input = referenceStudyInput({ sections: sections(...Array<number>(n).fill(10)), bonding: [{ kind: 'solid', sectionIds: Array.from({ length: n }, (_, i) => `S${i + 1}`) }], cases });
    expect(issuesOf(input)).toContainEqual({ field: 'cases', message: expect.stringContaining('21 cases on 1000 sections') });
    expect(bondingStudySchema.safeParse({ ...input, cases: cases.slice(0, 20) }).success).toBe(true);
    // Said once, however many of the cases are internal faults.
    const internal = { id: 'IF', name: 'internal', kind: 'internal-fault' as const, durationS: 0.5, internalFault: { circuitId: 'C1', phase: 'a' as const, jointIndex: 1, fromStart: { currentA: 1000 } } };
    const mixed = issuesOf({ ...input, cases: [...cases.slice(0, 19), internal, { ...internal, id: 'IF2' }] });
    expect(mixed.filter((i) => i.message.includes('section-cases'))).toHaveLength(1);
  });

  it(`more than ${STUDY_LIMITS.conductors} sheaths and ECCs in a cross-section`, () => {
    const input = referenceStudyInput() as Record<string, any>;
    input.circuits = Array.from({ length: 13 }, (_, i) => ({ id: `C${i + 1}`, name: 'c', cableTypeId: 'REF' }));
    input.layouts[0].circuits = input.circuits.map((c: { id: string }, i: number) => ({ circuitId: c.id, formation: 'trefoil', spacingM: 0.11, depthM: 1.2, centreXM: i * 0.5 }));
    input.eccs = [1, 2].map((k) => ({ id: `E${k}`, name: 'e', resistanceOhmPerKm: 0.1, gmrMm: 8, fromSectionId: 'S1', toSectionId: 'S1' }));
    input.layouts[0].eccs = [{ eccId: 'E1', xM: -1, depthM: 1 }, { eccId: 'E2', xM: -2, depthM: 1 }];
    input.cases = [{ id: 'N', name: 'n', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 100 }] }];
    expect(issuesOf(input)).toContainEqual({ field: 'eccs', message: expect.stringContaining('At most 40 sheaths and ECCs') });
  });

  it('the network solve needs no recursion: 10,000 chained nodes earth through one end without overflowing the stack', () => {
    const builder = new NetworkBuilder();
    const coupling = crossSectionCoupling([[{ re: 1e-4, im: 5e-5 }]], [], []);
    let prev = builder.addNode(0, 'n0');
    builder.addAdmittance(prev, EARTH, { re: 1, im: 0 });
    for (let i = 1; i <= 10_000; i++) {
      const next = builder.addNode(i, `n${i}`);
      builder.addSegment([prev], [next], 1, coupling);
      prev = next;
    }
    expect(() => builder.compile()).not.toThrow();
  });
});

describe('physically meaningless values are refused', () => {
  it('a section shorter than a millimetre, or longer than any route', () => {
    expect(issuesOf(referenceStudyInput({ sections: [{ id: 'S1', lengthM: 0.0005, layoutId: 'L' }] }))).toContainEqual({ field: 'sections.0.lengthM', message: expect.stringContaining('shorter than a millimetre') });
    expect(issuesOf(referenceStudyInput({ sections: [{ id: 'S1', lengthM: 2e6, layoutId: 'L' }] }))).toContainEqual({ field: 'sections.0.lengthM', message: expect.stringContaining('longer than any cable route') });
  });

  it('a soil resistivity whose earth-return depth is not much larger than the spacing', () => {
    // De = 658.5·√(ρ/f) (Carson; IEEE Std 367): at 0.0001 Ω·m and 50 Hz, 0.93 m against a 0.11 m trefoil ×10 = 1.1 m.
    expect(earthReturnDepthM(1e-4, 50)).toBeLessThan(10 * 0.11);
    expect(issuesOf(referenceStudyInput({ soilResistivityOhmM: 1e-4 }))).toContainEqual({ field: 'soilResistivityOhmM', message: expect.stringContaining('not much larger than the 0.11 m between conductors') });
    expect(bondingStudySchema.safeParse(referenceStudyInput({ soilResistivityOhmM: 1 })).success).toBe(true);
  });

  it('a current above any fault level, an electrode below a milliohm', () => {
    expect(issuesOf(referenceStudyInput({ currentA: 1e7 }))[0].field).toBe('cases.0.currents.0.currentA');
    expect(issuesOf(referenceStudyInput({ earthing: { routeStartOhm: 1e-6, routeEndOhm: 1, linkBoxOhm: 5 } }))[0].field).toBe('earthing.routeStartOhm');
  });
});

describe('exposure: earth-return depth against the separations', () => {
  it('refuses metalwork so far from the line that De is under five times the separation, naming the field', () => {
    const fence = JSON.parse(readFileSync('tests/fixtures/studies/marrow-lane-fence-exposure.json', 'utf8'));
    // De = 658.5·√(ρ/f) (Carson; IEEE Std 367); choose ρ so that De is four times the widest separation.
    const xs = [...fence.sources.map((s: { xM: number; yM: number }) => s), fence.object];
    let widest = 0;
    for (const a of xs) for (const b of xs) widest = Math.max(widest, Math.hypot(a.xM - b.xM, a.yM - b.yM));
    fence.soilResistivityOhmM = fence.frequencyHz * ((4 * widest) / 658.5) ** 2;
    expect(issuesOf(fence)).toContainEqual({ field: 'soilResistivityOhmM', message: expect.stringContaining('not much larger than') });
    fence.soilResistivityOhmM = fence.frequencyHz * ((6 * widest) / 658.5) ** 2;
    expect(studySchema.safeParse(fence).success).toBe(true);
  });
});
