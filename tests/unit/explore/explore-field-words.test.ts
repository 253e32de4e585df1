import { describe, expect, it } from 'vitest';
import { issuesAsFields, placementFieldErrors, sweepFieldErrors, sweepPlace, tornadoFieldErrors } from '../../../src/components/explore/explore-field-words';
import { explorationRequestSchema } from '../../../src/lib/schemas/exploration.schema';
import { SWEEP_LIMITS } from '../../../src/lib/calc/explore';

// The Explore tab's forms: errors beside their field in words, and the grid limit the sweep form
// shares with the server.

const refusal = (body: unknown) => {
  const r = explorationRequestSchema.safeParse(body);
  expect(r.success).toBe(false);
  return issuesAsFields(r.error!.issues);
};

describe('explore field errors in words', () => {
  it('places each sweep path beside its field and names it', () => {
    expect(sweepPlace('axes.1.toValue')).toEqual({ key: 'axes.1.toValue', words: 'Second input — to value' });
    expect(sweepPlace('axes.0.points')).toEqual({ key: 'axes.0.points', words: 'First input — points' });
    expect(sweepPlace('axes.0.input.sectionId')).toEqual({ key: 'axes.0.input', words: 'First input — which input' });
    expect(sweepPlace('axes')).toEqual({ key: 'axes', words: 'Grid' });
  });

  it('turns the schema refusals of a sweep into words beside the fields', () => {
    const fields = refusal({
      kind: 'sweep',
      axes: [
        { input: { kind: 'depth' }, fromValue: 0.8, toValue: 2, points: 10 },
        { input: { kind: 'soil-resistivity' }, fromValue: 200, toValue: 20, points: 3 },
      ],
    });
    expect(sweepFieldErrors(fields)).toEqual({ 'axes.1.toValue': 'Second input — to value: The range must end at or above its start.' });
  });

  it('refuses a grid over the server limit in the schema, beside the grid, with the same limit the core uses', () => {
    expect(SWEEP_LIMITS.maxPoints).toBe(1000);
    const axes = (a: number, b: number) => [
      { input: { kind: 'depth' }, fromValue: 0.8, toValue: 2, points: a },
      { input: { kind: 'soil-resistivity' }, fromValue: 20, toValue: 200, points: b },
    ];
    expect(explorationRequestSchema.safeParse({ kind: 'sweep', axes: axes(200, 5) }).success).toBe(true);
    expect(refusal({ kind: 'sweep', axes: axes(200, 6) })).toEqual([{ field: 'axes', message: 'A sweep of 1,200 grid points is over the limit of 1,000; use fewer points.' }]);
    expect(sweepFieldErrors(refusal({ kind: 'sweep', axes: axes(201, 1) }))).toEqual({ 'axes.0.points': 'First input — points: At most 200 points along one input.' });
  });

  it('says a tornado ± range once, beside its one field, though every input carries it', () => {
    const inputs = [{ kind: 'soil-resistivity' }, { kind: 'depth' }].map((input) => ({ input, plusMinusPct: 120 }));
    expect(tornadoFieldErrors(refusal({ kind: 'tornado', inputs }))).toEqual({ plusMinusPct: '± range: The ± range must stay below 100 %.' });
  });

  it('numbers placement windows from 1 and names the drum length', () => {
    const fields = refusal({ kind: 'placement', drumLengthM: 0, windows: [{ fromM: 400, toM: 600 }, { fromM: -5, toM: 900 }] });
    expect(placementFieldErrors(fields)).toEqual({
      drumLengthM: 'Drum length limit: The drum length must be greater than zero.',
      windows: 'Window 2 — start: A window cannot start before the route.',
    });
    // The core's own refusal of a window that ends before it starts (field windows.0.toM).
    expect(placementFieldErrors([{ field: 'windows.0.toM', message: 'A window must end at or after its start.' }])).toEqual({ windows: 'Window 1 — end: A window must end at or after its start.' });
  });
});
