import { describe, expect, it } from 'vitest';
import demoLimits from '../../fixtures/limit-sets/demo-owner.json';
import type { LimitSet } from '../../../src/lib/schemas/limit-set.schema';
import { axisValues, sweepPoint, type SweepAxis } from '../../../src/lib/calc/explore';
import { sweepPoints, sweepResult } from '../../../src/lib/explore/exploration-steps';
import { evenlyPicked, sweepCurves, sweepGrid } from '../../../src/lib/explore/sweep-series';
import { referenceStudy } from '../../helpers/reference-study';

// The family of curves a two-input sweep is drawn as (Explore tab and record figure): each curve
// must be the grid points at one value of the second input, read back against the core's own
// point-by-point calculation, not against the grid-order arithmetic the helper uses.

const limits = demoLimits as LimitSet;
const axes: SweepAxis[] = [
  { input: { kind: 'load-current' }, fromValue: 500, toValue: 3000, points: 6 },
  { input: { kind: 'soil-resistivity' }, fromValue: 20, toValue: 1000, points: 3 },
];
const task = { kind: 'sweep' as const, study: referenceStudy(), limits, axes };
const result = sweepResult(task, sweepPoints(task, 0, 18));
const standing = (values: number[]) => {
  const index = axisValues(axes[0]).indexOf(values[0]) + axes[0].points * axisValues(axes[1]).indexOf(values[1]);
  return sweepPoint(referenceStudy(), limits, axes, index).quantities!.find((q) => q.criterion === 'standing-voltage-normal')!;
};

describe('two-input sweep as a family of curves', () => {
  it('draws one curve per value of the second input, each the quantity against the first input', () => {
    const { curves, secondCount, limit, unit } = sweepCurves(result, 'standing-voltage-normal');
    expect(secondCount).toBe(3);
    expect(curves.map((c) => c.secondValue)).toEqual([20, 510, 1000]);
    expect(limit).toBe(65);
    expect(unit).toBe('V');
    for (const c of curves) {
      expect(c.points.map((p) => p.x)).toEqual([500, 1000, 1500, 2000, 2500, 3000]);
      c.points.forEach((p) => expect(p.y).toBe(standing([p.x, c.secondValue!]).value));
    }
    // Single-point bonding: the standing voltage is proportional to the load current (E ∝ I), on every curve.
    curves.forEach((c) => expect(c.points[5].y! / c.points[0].y!).toBeCloseTo(6, 6));
  });

  it('thins a long second axis to evenly spaced curves, ends kept', () => {
    expect(evenlyPicked(20, 8)).toEqual([0, 3, 5, 8, 11, 14, 16, 19]);
    expect(evenlyPicked(3, 8)).toEqual([0, 1, 2]);
    expect(sweepCurves(result, 'standing-voltage-normal', 2).curves.map((c) => c.secondValue)).toEqual([20, 1000]);
  });

  it('tabulates the grid with failing points marked where the margin is negative', () => {
    const grid = sweepGrid(result, 'standing-voltage-normal');
    expect(grid.firstValues).toEqual([500, 1000, 1500, 2000, 2500, 3000]);
    expect(grid.rows.map((r) => r.secondValue)).toEqual([20, 510, 1000]);
    grid.rows.forEach((r) =>
      r.cells.forEach((cell, i) => {
        const q = standing([grid.firstValues[i], r.secondValue]);
        expect(cell.value).toBe(q.value);
        expect(cell.failing).toBe(q.value > 65);
      }),
    );
    // Open end E·L = 49.54 V/km × 0.5 km per kA (shared/reference/methods.md): 65 V is passed between 2.5 and 3 kA.
    expect(grid.rows.every((r) => r.cells[5].failing && !r.cells[4].failing)).toBe(true);
  });

  it('gives a one-input sweep a single curve with no second value', () => {
    const one = { ...task, axes: [axes[0]] };
    const r = sweepResult(one, sweepPoints(one, 0, 6));
    const { curves, secondCount } = sweepCurves(r, 'standing-voltage-normal');
    expect(secondCount).toBe(1);
    expect(curves).toHaveLength(1);
    expect(curves[0].secondValue).toBeNull();
  });
});
