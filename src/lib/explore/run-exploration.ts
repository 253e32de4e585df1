import type { BondingStudy } from '../schemas/bonding-study.schema';
import type { LimitSet } from '../schemas/limit-set.schema';
import {
  appraiseBondingOptions,
  baseValue,
  checkSweep,
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

// Runs an exploration task. For now in-process, in chunks of a few milliseconds with the event
// loop free between them (setImmediate), so other requests are served during a sweep; the
// interface (task, {onProgress, signal}) => Promise<result> is what a worker pool takes over.

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

export interface RunOptions {
  onProgress?: (progress: { done: number; total: number }) => void;
  signal?: AbortSignal;
}

/** Time one chunk may hold the event loop, ms. */
const CHUNK_MS = 25;

const yieldToLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

function throwIfAborted(signal?: AbortSignal) {
  if (signal?.aborted) throw signal.reason instanceof Error ? signal.reason : new DOMException('The exploration was cancelled.', 'AbortError');
}

/** Runs steps 0..total−1, yielding to the event loop every CHUNK_MS and reporting progress. */
async function inChunks<T>(total: number, step: (i: number) => T, { onProgress, signal }: RunOptions): Promise<T[]> {
  const out: T[] = [];
  onProgress?.({ done: 0, total });
  // The caller (a request) gets its answer before the first chunk runs.
  await yieldToLoop();
  while (out.length < total) {
    throwIfAborted(signal);
    const t0 = performance.now();
    do out.push(step(out.length));
    while (out.length < total && performance.now() - t0 < CHUNK_MS);
    onProgress?.({ done: out.length, total });
    if (out.length < total) await yieldToLoop();
  }
  throwIfAborted(signal);
  return out;
}

function designFigures(study: BondingStudy, limits: LimitSet) {
  const e = evaluateStudy(study, limits);
  if (!e.ok) return { worstStandingV: null, lossFactor: null, error: e.error };
  const normal = e.results.cases.filter((c) => c.kind === 'normal');
  const standing = e.results.worst.find((w) => w.quantity === 'standing-voltage-normal')?.value ?? null;
  const lf = normal.flatMap((c) => c.lossFactors.map((l) => l.lossFactor));
  return { worstStandingV: standing, lossFactor: lf.length ? Math.max(...lf) : null };
}

export async function runExploration(task: ExplorationTask, options: RunOptions = {}): Promise<ExplorationResult> {
  throwIfAborted(options.signal);
  switch (task.kind) {
    case 'sweep': {
      const total = checkSweep(task.study, task.axes);
      const points = await inChunks(total, (i) => sweepPoint(task.study, task.limits, task.axes, i), options);
      return {
        kind: 'sweep',
        axes: task.axes.map((a) => ({ ...a, label: inputLabel(a.input), baseValue: baseValue(task.study, a.input) })),
        points,
        firstFailures: firstFailures(points),
      };
    }
    case 'appraisal': {
      // Seven options of one calculation each: one chunk, progress at the ends.
      const [a] = await inChunks(1, () => appraiseBondingOptions(task.study, task.limits), options);
      return { kind: 'appraisal', ...a };
    }
    case 'tornado': {
      const [t] = await inChunks(1, () => tornado(task.study, task.limits, task.inputs), options);
      return { kind: 'tornado', ...t };
    }
    case 'placement': {
      const [r] = await inChunks(
        1,
        (): PlacementResult => {
          const placement = suggestPlacement(task.study, task.request);
          return { kind: 'placement', placement, current: designFigures(task.study, task.limits), suggested: placement.suggestedStudy ? designFigures(placement.suggestedStudy, task.limits) : null };
        },
        options,
      );
      return r;
    }
  }
}
