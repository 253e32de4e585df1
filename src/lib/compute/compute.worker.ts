// Entry of the compute worker threads (piscina calls the default export with each task).
// scripts/build-workers.mjs bundles it to dist/workers/compute.mjs.
import { type ComputeTask, runComputeTask } from './compute-tasks';

export default function computeWorker(task: ComputeTask) {
  return runComputeTask(task);
}
