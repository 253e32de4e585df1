import { checkSweep } from '../calc/explore';
import { compute, computeParallelism, computesInWorkers } from '../compute/compute-pool';
import { type ExplorationResult, type ExplorationTask, explorationOnce, sweepPoints, sweepResult } from './exploration-steps';

export type { ExplorationResult, ExplorationTask, PlacementResult, SweepResult } from './exploration-steps';

// Schedules an exploration. With the worker pool (src/lib/compute), a sweep goes out in small
// batches of grid points, as many at once as the pool has threads, so progress and cancelling
// are seen between batches and the request thread stays free; an appraisal, tornado or
// placement is one task. Without the pool, the same work runs here in chunks of a few
// milliseconds with the event loop free between them (setImmediate).

export interface RunOptions {
  onProgress?: (progress: { done: number; total: number }) => void;
  signal?: AbortSignal;
}

/** Time one chunk may hold the event loop, ms. */
const CHUNK_MS = 25;
/** Grid points per worker task: small enough for progress every fraction of a second, large enough that the handing over is negligible. */
const POINTS_PER_TASK = 4;

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

/** A sweep's points in batches on the worker pool, in grid order. */
async function sweepInWorkers(task: Extract<ExplorationTask, { kind: 'sweep' }>, total: number, { onProgress, signal }: RunOptions) {
  const batches: Array<{ from: number; to: number }> = [];
  for (let from = 0; from < total; from += POINTS_PER_TASK) batches.push({ from, to: Math.min(total, from + POINTS_PER_TASK) });
  const results: Awaited<ReturnType<typeof sweepPoints>>[] = new Array(batches.length);
  let next = 0;
  let done = 0;
  onProgress?.({ done: 0, total });
  const lane = async () => {
    while (next < batches.length) {
      throwIfAborted(signal);
      const k = next++;
      results[k] = await compute({ task: 'sweepPoints', sweep: task, ...batches[k] });
      done += batches[k].to - batches[k].from;
      onProgress?.({ done, total });
    }
  };
  await Promise.all(Array.from({ length: Math.min(computeParallelism(), batches.length) }, lane));
  throwIfAborted(signal);
  return results.flat();
}

export async function runExploration(task: ExplorationTask, options: RunOptions = {}): Promise<ExplorationResult> {
  throwIfAborted(options.signal);
  const inWorkers = computesInWorkers();
  if (task.kind === 'sweep') {
    const total = checkSweep(task.study, task.axes);
    const points = inWorkers ? await sweepInWorkers(task, total, options) : await inChunks(total, (i) => sweepPoints(task, i, i + 1)[0], options);
    return sweepResult(task, points);
  }
  if (!inWorkers) {
    const [r] = await inChunks(1, () => explorationOnce(task), options);
    return r;
  }
  options.onProgress?.({ done: 0, total: 1 });
  const r = await compute({ task: 'exploreOnce', exploration: task });
  throwIfAborted(options.signal);
  options.onProgress?.({ done: 1, total: 1 });
  return r;
}
