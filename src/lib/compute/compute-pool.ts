import { existsSync, readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import { AppError } from '../errors';
import { type ComputeOutput, type ComputeTask, type TaskResult, runComputeTask } from './compute-tasks';

// Calculation, recomputation and record rendering run in a pool of worker threads, so that a
// long route never holds up other requests. The worker is the bundle that `npm run build`
// writes (dist/workers/compute.mjs); without it (a checkout that has not been built) the work
// runs on the request thread, and the server says so once.

let pool: Piscina | null | undefined;

/** Young-generation size of each compute thread, MB (three semi-spaces of 32 MB). */
export const COMPUTE_YOUNG_GENERATION_MB = 96;

/** Threads for the pool: COMPUTE_THREADS, else one fewer than the machine's cores (at least one); 0 runs on the request thread. */
export function computeThreads(env: NodeJS.ProcessEnv = process.env): number {
  const configured = env.COMPUTE_THREADS;
  if (configured !== undefined && configured !== '') {
    const n = Number(configured);
    if (!Number.isInteger(n) || n < 0 || n > 256) throw new Error(`COMPUTE_THREADS must be a whole number from 0 to 256, not "${configured}".`);
    return n;
  }
  return Math.max(1, availableParallelism() - 1);
}

/** dist/workers/compute.mjs of this checkout, found from here whether this module runs from src/ or from a built chunk. */
export function workerBundlePath(): string | null {
  let dir = path.dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 8; i++) {
    const manifest = path.join(dir, 'package.json');
    if (existsSync(manifest) && JSON.parse(readFileSync(manifest, 'utf8')).name === 'sheathwise') {
      const file = path.join(dir, 'dist', 'workers', 'compute.mjs');
      return existsSync(file) ? file : null;
    }
    dir = path.dirname(dir);
  }
  return null;
}

function computePool(): Piscina | null {
  if (pool !== undefined) return pool;
  // `astro dev` serves the sources as they change, and the bundle in dist/ may be older.
  const devServer = import.meta.env?.DEV === true && !process.env.VITEST;
  const threads = devServer ? 0 : computeThreads();
  const file = threads > 0 ? workerBundlePath() : null;
  if (threads > 0 && !file) console.warn('[compute] dist/workers/compute.mjs is missing (run npm run build): calculations run on the request thread');
  // Idle threads stay: starting one costs more than most calculations.
  // Niced (Linux, through @napi-rs/nice): on a busy machine the scheduler serves the request
  // thread and the database before a long calculation.
  // A larger young generation (V8's default semi-space is 16 MB): a calculation's results are
  // short-lived but outlive several minor collections at the default size, which then copy and
  // promote them; a 400-point sweep spent about a quarter of its time collecting garbage.
  pool = file
    ? new Piscina({ filename: pathToFileURL(file).href, minThreads: threads, maxThreads: threads, idleTimeout: 60_000, niceIncrement: 10, resourceLimits: { maxYoungGenerationSizeMb: COMPUTE_YOUNG_GENERATION_MB } })
    : null;
  return pool;
}

/** Whether tasks go to worker threads in this process. */
export const computesInWorkers = () => computePool() !== null;

/** How many tasks run at once: the pool's threads, or one on the request thread. */
export const computeParallelism = () => computePool()?.options.maxThreads ?? 1;

/** Runs a task in the pool (or here without one); a catalogue error from the task is thrown as an AppError. */
export async function compute<K extends ComputeTask['task']>(task: Extract<ComputeTask, { task: K }>): Promise<ComputeOutput[K]> {
  const p = computePool();
  const outcome = (p ? await p.run(task) : await runComputeTask(task)) as TaskResult<ComputeOutput[K]>;
  if (!outcome.ok) throw new AppError(outcome.error.errorName, outcome.error.message, outcome.error.fields);
  return outcome.value;
}

/** Stops the pool's threads (tests and scripts that end their process themselves). */
export async function closeComputePool(): Promise<void> {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
