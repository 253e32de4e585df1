import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { jointInWords, jointShortLabel } from '../../../src/lib/calc/bonding/joint-names';
import { evaluateBondingCompliance } from '../../../src/lib/calc/compliance';

// Joint bays may carry their own names; results name them, and nothing else changes.

const fixture = () => JSON.parse(readFileSync('tests/fixtures/studies/fernhollow-cross-bonded.json', 'utf8'));

describe('joint bay names', () => {
  it('name the joint in the result labels and leave every figure as it was', () => {
    const plain = calculateBondingStudy(bondingStudySchema.parse(fixture()));
    const named = calculateBondingStudy(bondingStudySchema.parse({ ...fixture(), jointNames: [{ jointIndex: 2, name: 'Bay 3' }] }));
    const point = named.cases[0].points.find((p) => p.jointIndex === 2)!;
    expect(point.label).toMatch(/^joint bay Bay 3 \(joint 2\) \(\d+ m\)/);
    expect(named.cases[0].points.find((p) => p.jointIndex === 1)!.label).toMatch(/^joint 1 \(/);
    const strip = (r: typeof plain) => JSON.stringify(r).replace(/joint bay Bay 3 \(joint 2\)/g, 'joint 2');
    expect(strip(named)).toBe(strip(plain));
  });

  it('name the joint in the checklist, and only there the wording changes', () => {
    const noLimits = { name: 'none', version: 1, limits: {} };
    const items = (input: unknown) => {
      const study = bondingStudySchema.parse(input);
      return evaluateBondingCompliance(study, calculateBondingStudy(study), noLimits as never);
    };
    const plain = items(fixture());
    const named = items({ ...fixture(), jointNames: [{ jointIndex: 4, name: 'Ford Bay' }] });
    const svlAt4 = named.filter((i) => i.where?.includes('joint bay Ford Bay (joint 4)'));
    expect(svlAt4.length).toBeGreaterThan(0);
    expect(JSON.stringify(named).replace(/joint bay Ford Bay \(joint 4\)/g, 'joint 4')).toBe(JSON.stringify(plain));
  });

  it('are words for screens and sentences, with J<n> and "joint n" when unnamed', () => {
    const study = { jointNames: [{ jointIndex: 3, name: 'Mill Lane' }] };
    expect(jointShortLabel(study, 3)).toBe('Mill Lane');
    expect(jointShortLabel(study, 4)).toBe('J4');
    expect(jointInWords(study, 3)).toBe('joint bay Mill Lane (joint 3)');
    expect(jointInWords({}, 3)).toBe('joint 3');
  });

  it('are refused by field when the joint does not exist, is named twice, or two joints share a name', () => {
    const issues = (jointNames: unknown) => {
      const r = bondingStudySchema.safeParse({ ...fixture(), jointNames });
      return r.success ? [] : r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    };
    const n = fixture().sections.length;
    expect(issues([{ jointIndex: n + 1, name: 'X' }])).toEqual([`jointNames.0.jointIndex: Joint ${n + 1} does not exist: joints run from 0 to ${n}.`]);
    expect(issues([{ jointIndex: 1, name: 'A' }, { jointIndex: 1, name: 'B' }])).toEqual(['jointNames.1.jointIndex: Joint 1 has two names; keep one.']);
    expect(issues([{ jointIndex: 1, name: 'A' }, { jointIndex: 2, name: 'a' }])).toEqual(['jointNames.1.name: The name "a" is given to two joints; make each one unique.']);
    expect(issues([{ jointIndex: 1, name: '  ' }])).toEqual(['jointNames.0.name: Give the joint bay a name, or remove the entry.']);
  });
});
