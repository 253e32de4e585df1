// Bundles the compute worker (src/lib/compute/compute.worker.ts) to dist/workers/compute.mjs:
// our own modules inlined, packages left to node_modules. Part of `npm run build`; the test
// suite runs it too (tests/helpers/build-workers.setup.ts).
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export async function buildWorkers() {
  await build({
    absWorkingDir: root,
    entryPoints: { compute: 'src/lib/compute/compute.worker.ts' },
    outdir: 'dist/workers',
    outExtension: { '.js': '.mjs' },
    bundle: true,
    packages: 'external',
    platform: 'node',
    format: 'esm',
    target: 'node20',
    sourcemap: true,
    logLevel: 'warning',
  });
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  await buildWorkers();
  console.log('compute worker: dist/workers/compute.mjs');
}
