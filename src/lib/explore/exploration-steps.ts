import type { BondingStudy } from '../schemas/bonding-study.schema';
import type { LimitSet } from '../schemas/limit-set.schema';
import {
  appraiseBondingOptions,
  baseValue,
  firstFailures,
  inputLabel,
  suggestPlacement,
  sweepPoint,
  tornado,
  evaluateStudy,
  type Appraisal,
  type FirstFailure,
  type Placement,
  type PlacementRequest,
  type SweepAxis,
  type SweepPoint,
  type Tornado,
  type TornadoInput,
} from '../calc/explore';

// The work of each exploration as plain functions of cloneable data, so that a worker thread
// (src/lib/compute) or the request thread in chunks (run-exploration.ts) can run it.

export type ExplorationTask =
  | { kind: 'appraisal'; study: BondingStudy; limits: LimitSet }
  | { kind: 'sweep'; study: BondingStudy; limits: LimitSet; axes: SweepAxis[] }
  | { kind: 'tornado'; study: BondingStudy; limits: LimitSet; inputs: TornadoInput[] }
  | { kind: 'placement'; study: BondingStudy; limits: LimitSet; request: PlacementRequest };

export interface SweepResult {
  kind: 'sweep';
  axes: Array<SweepAxis & { label: string; baseValue: number | null }>;
  points: SweepPoint[];
  firstFailures: FirstFailure[];
}

export interface PlacementResult {
  kind: 'placement';
  placement: Placement;
  /** Worst standing voltage (normal load, V) and largest λ1 of the current and the suggested design, by the full solve. */
  current: { worstStandingV: number | null; lossFactor: number | null; error?: string };
  suggested: { worstStandingV: number | null; lossFactor: number | null; error?: string } | null;
}

export type ExplorationResult = ({ kind: 'appraisal' } & Appraisal) | SweepResult | ({ kind: 'tornado' } & Tornado) | PlacementResult;

function designFigures(study: BondingStudy, limits: LimitSet) {
  const e = evaluateStudy(study, limits);
  if (!e.ok) return { worstStandingV: null, lossFactor: null, error: e.error };
  const normal = e.results.cases.filter((c) => c.kind === 'normal');
  const standing = e.results.worst.find((w) => w.quantity === 'standing-voltage-normal')?.value ?? null;
  const lf = normal.flatMap((c) => c.lossFactors.map((l) => l.lossFactor));
  return { worstStandingV: standing, lossFactor: lf.length ? Math.max(...lf) : null };
}

/** A sweep's grid points from..to−1 (indices into the grid of its axes). */
export function sweepPoints(task: Extract<ExplorationTask, { kind: 'sweep' }>, from: number, to: number): SweepPoint[] {
  const out: SweepPoint[] = [];
  for (let i = from; i < to; i++) out.push(sweepPoint(task.study, task.limits, task.axes, i));
  return out;
}

/** A sweep's result from its points, in grid order. */
export function sweepResult(task: Extract<ExplorationTask, { kind: 'sweep' }>, points: SweepPoint[]): SweepResult {
  return {
    kind: 'sweep',
    axes: task.axes.map((a) => ({ ...a, label: inputLabel(a.input), baseValue: baseValue(task.study, a.input) })),
    points,
    firstFailures: firstFailures(points),
  };
}

/** An appraisal, tornado or placement: one piece of work each (a few calculations). */
export function explorationOnce(task: Exclude<ExplorationTask, { kind: 'sweep' }>): ExplorationResult {
  switch (task.kind) {
    case 'appraisal':
      return { kind: 'appraisal', ...appraiseBondingOptions(task.study, task.limits) };
    case 'tornado':
      return { kind: 'tornado', ...tornado(task.study, task.limits, task.inputs) };
    case 'placement': {
      const placement = suggestPlacement(task.study, task.request);
      return { kind: 'placement', placement, current: designFigures(task.study, task.limits), suggested: placement.suggestedStudy ? designFigures(placement.suggestedStudy, task.limits) : null };
    }
  }
}
