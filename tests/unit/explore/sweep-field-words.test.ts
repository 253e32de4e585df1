import { describe, expect, it } from 'vitest';
import { sweepFieldErrors, sweepFieldKey, sweepFieldWords } from '../../../src/components/explore/sweep-field-words';
import { explorationRequestSchema } from '../../../src/lib/schemas/exploration.schema';
import { SWEEP_LIMITS } from '../../../src/lib/calc/explore';

// The Explore tab's sweep form: errors beside their field in words, and the grid limit it shares with the server.

describe('sweep field errors in words', () => {
  it('places each path beside its field and names it', () => {
    expect(sweepFieldKey('axes.1.toValue')).toBe('axes.1.toValue');
    expect(sweepFieldKey('axes.0.input.sectionId')).toBe('axes.0.input');
    expect(sweepFieldKey('axes')).toBe('axes');
    expect(sweepFieldWords('axes.1.toValue')).toBe('Second input — to value');
    expect(sweepFieldWords('axes.0.points')).toBe('First input — points');
    expect(sweepFieldWords('axes')).toBe('Grid');
  });

  it('turns the schema refusals of a sweep into words beside the fields', () => {
    const r = explorationRequestSchema.safeParse({
      kind: 'sweep',
      axes: [
        { input: { kind: 'depth' }, fromValue: 0.8, toValue: 2, points: 10 },
        { input: { kind: 'soil-resistivity' }, fromValue: 200, toValue: 20, points: 3 },
      ],
    });
    expect(r.success).toBe(false);
    const errors = sweepFieldErrors(r.error!.issues.map((i) => ({ field: i.path.join('.'), message: i.message })));
    expect(errors).toEqual({ 'axes.1.toValue': 'Second input — to value: The range must end at or above its start.' });
  });

  it('refuses a grid over the server limit in the schema, beside the grid, with the same limit the core uses', () => {
    expect(SWEEP_LIMITS.maxPoints).toBe(1000);
    const axes = (a: number, b: number) => [
      { input: { kind: 'depth' }, fromValue: 0.8, toValue: 2, points: a },
      { input: { kind: 'soil-resistivity' }, fromValue: 20, toValue: 200, points: b },
    ];
    expect(explorationRequestSchema.safeParse({ kind: 'sweep', axes: axes(200, 5) }).success).toBe(true);
    const over = explorationRequestSchema.safeParse({ kind: 'sweep', axes: axes(200, 6) });
    expect(over.error!.issues.map((i) => ({ field: i.path.join('.'), message: i.message }))).toEqual([{ field: 'axes', message: 'A sweep of 1,200 grid points is over the limit of 1,000; use fewer points.' }]);
    const perAxis = explorationRequestSchema.safeParse({ kind: 'sweep', axes: axes(201, 1) });
    expect(perAxis.error!.issues.map((i) => i.path.join('.'))).toEqual(['axes.0.points']);
  });
});
