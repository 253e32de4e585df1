import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { calculateStudy, evaluateCompliance } from '../../../src/lib/calc';
import { studySchema } from '../../../src/lib/schemas/study.schema';
import { limitSetSchema, type LimitSet } from '../../../src/lib/schemas/limit-set.schema';
import { referenceStudy } from '../../helpers/reference-study';

const demoLimits = limitSetSchema.parse(JSON.parse(readFileSync('tests/fixtures/limit-sets/demo-owner.json', 'utf8')));
const withLimit = (key: keyof LimitSet['limits'], value: number): LimitSet => ({
  name: 'test limits',
  version: 3,
  limits: { [key]: { value, unit: 'V', source: 'owner\'s standard (test)' } },
});

describe('compliance checklist', () => {
  // SV-7 [derived]: trefoil single-point 500 m at 1000 A stands at 24.770 V at the open end.
  const study = referenceStudy();
  const results = calculateStudy(study);

  it('passes a standing voltage under the limit, with value, limit, margin and source', () => {
    const [item] = evaluateCompliance(study, results, withLimit('standing-voltage-normal', 50)).filter((i) => i.criterion === 'standing-voltage-normal');
    expect(item.status).toBe('pass');
    expect(item.value).toBeCloseTo(24.77, 2);
    expect(item.limit).toBe(50);
    expect(item.marginPct).toBeCloseTo(((50 - 24.770118) / 50) * 100, 3);
    expect(item.source).toBe("test limits v3: owner's standard (test)");
    expect(item.where).toContain('joint 1');
  });

  it('fails the same result against a tighter limit, with a negative margin', () => {
    const [item] = evaluateCompliance(study, results, withLimit('standing-voltage-normal', 17)).filter((i) => i.criterion === 'standing-voltage-normal');
    expect(item.status).toBe('fail');
    expect(item.marginPct!).toBeLessThan(0);
  });

  it('marks a criterion with no value in the limit set as not evaluated against a limit', () => {
    const [item] = evaluateCompliance(study, results, { name: 'empty', version: 1, limits: {} }).filter((i) => i.criterion === 'standing-voltage-normal');
    expect(item.status).toBe('no-limit');
    expect(item.limit).toBeNull();
  });

  it('checks an exposure against the IEEE 80 tolerable touch voltage for the case duration', () => {
    const fence = studySchema.parse(JSON.parse(readFileSync('tests/fixtures/studies/marrow-lane-fence-exposure.json', 'utf8')));
    const items = evaluateCompliance(fence, calculateStudy(fence), demoLimits);
    const touch = items.find((i) => i.criterion === 'touch-voltage-fault')!;
    // GD-4 inputs at 80 Ω·m: (1000 + 1.5·80)·0.116/√0.5 [derived, IEEE Std 80-2013].
    expect(touch.limit).toBeCloseTo((1000 + 1.5 * 80) * (0.116 / Math.sqrt(0.5)), 6);
    expect(items.map((i) => i.criterion)).toEqual(['metalwork-voltage-normal', 'induced-emf-fault', 'touch-voltage-fault']);
  });

  it('names the reference of every exposure voltage: the far end of a fence earthed at its start is the accessible one', () => {
    const fence = studySchema.parse(JSON.parse(readFileSync('tests/fixtures/studies/marrow-lane-fence-exposure.json', 'utf8')));
    const results = calculateStudy(fence);
    if (results.kind !== 'exposure') throw new Error('expected an exposure result');
    for (const c of results.cases) {
      // Earthed at the start only: the start sits near remote earth, the free end carries the EMF (common practice).
      expect(c.reference).toBe('remote earth');
      expect(c.accessibleAt).toBe('end');
      expect(c.endV).toBeGreaterThan(c.startV);
    }
    const items = evaluateCompliance(fence, results, demoLimits);
    expect(items.find((i) => i.criterion === 'metalwork-voltage-normal')!.where).toBe('end of the parallel run, to remote earth');
    expect(items.find((i) => i.criterion === 'induced-emf-fault')!.where).toMatch(/end to end with both ends open/);
  });
});
