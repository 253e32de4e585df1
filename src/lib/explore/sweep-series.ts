import type { SweepResult } from './exploration-steps';

// A two-input sweep drawn as a family of curves: one curve per value of the second input, the
// checked quantity against the first. Shared by the Explore tab and the record's figure, so the
// screen and the printed record show the same curves. Plain data in, plain data out.

export interface SweepCurve {
  /** The second input's value along this curve; null for a one-input sweep. */
  secondValue: number | null;
  /** One point per value of the first input; y null where the point was not calculated. */
  points: Array<{ x: number; y: number | null }>;
}

export interface SweepCurves {
  curves: SweepCurve[];
  /** How many values the second input takes (1 for a one-input sweep): more than curves.length when some were left out. */
  secondCount: number;
  limit: number | null;
  unit: string;
}

/** Largest number of curves drawn; a longer second axis shows evenly spaced values, ends included. */
export const MAX_CURVES = 8;

/** Indices 0..count−1 thinned to at most `most`, evenly spaced, first and last kept. */
export function evenlyPicked(count: number, most: number): number[] {
  if (count <= most) return Array.from({ length: count }, (_, k) => k);
  return [...new Set(Array.from({ length: most }, (_, k) => Math.round((k * (count - 1)) / (most - 1))))];
}

/** The curves of one checked quantity (criterion) of a sweep. Grid order: the first input runs fastest. */
export function sweepCurves(s: SweepResult, criterion: string, most = MAX_CURVES): SweepCurves {
  const first = s.axes[0].points;
  const secondCount = s.axes.length > 1 ? s.axes[1].points : 1;
  const found = s.points.flatMap((p) => p.quantities ?? []).find((q) => q.criterion === criterion);
  const curves = evenlyPicked(secondCount, most).map((k): SweepCurve => {
    const row = s.points.slice(k * first, (k + 1) * first);
    return {
      secondValue: s.axes.length > 1 ? (row[0]?.values[1] ?? null) : null,
      points: row.map((p) => ({ x: p.values[0], y: p.quantities?.find((q) => q.criterion === criterion)?.value ?? null })),
    };
  });
  return { curves, secondCount, limit: found?.limit ?? null, unit: found?.unit ?? '' };
}

/** One row per value of the second input, one cell per value of the first: the checked quantity and whether it passes. */
export function sweepGrid(s: SweepResult, criterion: string): { firstValues: number[]; rows: Array<{ secondValue: number; cells: Array<{ value: number | null; failing: boolean; error?: string }> }> } {
  const first = s.axes[0].points;
  const secondCount = s.axes.length > 1 ? s.axes[1].points : 1;
  return {
    firstValues: s.points.slice(0, first).map((p) => p.values[0]),
    rows: Array.from({ length: secondCount }, (_, k) => {
      const row = s.points.slice(k * first, (k + 1) * first);
      return {
        secondValue: row[0]?.values[1] ?? NaN,
        cells: row.map((p) => {
          const q = p.quantities?.find((x) => x.criterion === criterion);
          return { value: q?.value ?? null, failing: q?.marginPct !== null && q?.marginPct !== undefined && q.marginPct < 0, error: p.error };
        }),
      };
    }),
  };
}
