// vitest globalSetup: bundles the compute worker from the current sources, so that services
// called in the test process run their calculations in worker threads as the server does.
import { buildWorkers } from '../../scripts/build-workers.mjs';

export default async function setup() {
  await buildWorkers();
}
