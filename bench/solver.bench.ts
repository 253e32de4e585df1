// npm run bench: timing of the coupled-network solver on reference routes. Not part of the tests.
import { performance } from 'node:perf_hooks';
import { readFileSync } from 'node:fs';
import { calculateBondingStudy } from '../src/lib/calc/bonding/solve-bonding';
import { buildBondingNetwork } from '../src/lib/calc/bonding/network-model';
import { caseSources } from '../src/lib/calc/bonding/case-sources';
import { abs, sub } from '../src/lib/calc/complex';
import { solvePhysicalNetworkWithMathjs, solveWithMathjs } from '../tests/helpers/dense-reference';
import { SVL_OFF_TAG } from '../src/lib/calc/bonding/network-model';
import { crossBondedRoute } from './reference-routes';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

function timeIt(fn: () => void, runs: number, warmUps = 5): number {
  for (let i = 0; i < warmUps; i++) fn(); // warm-up: let the JIT settle
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    times.push(performance.now() - t0);
  }
  return median(times);
}

function solveAllCases(study: ReturnType<typeof crossBondedRoute>) {
  const model = buildBondingNetwork(study);
  const network = model.builder.compile(new Set([SVL_OFF_TAG]));
  return study.cases.map((c) => network.solve(caseSources(study, model, c)));
}

const large = crossBondedRoute({ circuits: 2, majorSections: 30, withEcc: true });
const largeModel = buildBondingNetwork(large);
const largeNet = largeModel.builder.compile(new Set([SVL_OFF_TAG]));
const naive = largeModel.jointNodes.reduce((n, j) => n + j.left.length + j.right.length + j.ecc.size + (j.earthBar === undefined ? 0 : 1), 0);
console.log('Large route: 2 circuits, 30 cross-bonded major sections (90 minor sections), one ECC, 8 cases');
console.log(`  unknowns: ${naive} node voltages before merging bonds, ${largeNet.size} after; half-bandwidth ${largeNet.bandwidth}`);
console.log(`  network solve (assemble, factor, 8 cases):  median ${timeIt(() => solveAllCases(large), 50).toFixed(2)} ms  (target ≤ 10 ms)`);
console.log(`  full calculation with all outputs:          median ${timeIt(() => calculateBondingStudy(large), 30).toFixed(2)} ms`);

const medium = crossBondedRoute({ circuits: 1, majorSections: 5, withEcc: false });
const mediumModel = buildBondingNetwork(medium);
const mediumNet = mediumModel.builder.compile(new Set([SVL_OFF_TAG]));
const sources = medium.cases.map((c) => caseSources(medium, mediumModel, c));
const banded = timeIt(() => solveAllCases(medium), 50);
// mathjs warmed like the banded solve and timed as the median of several runs, not one cold run.
const dense = sources.map((s) => solveWithMathjs(mediumNet, s));
const mathjsMs = timeIt(() => sources.forEach((s) => solveWithMathjs(mediumNet, s)), 7, 2);
let worst = 0;
sources.forEach((s, k) => {
  const ours = mediumNet.solve(s);
  const scale = Math.max(...dense[k].map(abs));
  mediumModel.jointNodes.forEach((j) =>
    [...j.left, ...j.right].forEach((node) => {
      const u = mediumNet.unknownOf(node);
      if (u >= 0) worst = Math.max(worst, abs(sub(ours.voltage(node), dense[k][u])) / scale);
    }),
  );
});
console.log('Medium route: 1 circuit, 5 cross-bonded major sections, 8 cases');
console.log(`  unknowns ${mediumNet.size}; banded ${banded.toFixed(3)} ms vs mathjs dense ${mathjsMs.toFixed(1)} ms (both warmed, medians): ${(mathjsMs / banded).toFixed(0)}× faster (target ≥ 50×)`);
console.log(`  largest node-voltage difference: ${worst.toExponential(2)} relative (target ≤ 1e-8)`);
// The same physical network rebuilt from its elements (no merged nodes, impedance form) for one case.
const physical = solvePhysicalNetworkWithMathjs(mediumModel.builder, new Set([SVL_OFF_TAG]), sources[0]);
const physicalOurs = mediumNet.solve(sources[0]);
let worstPhysical = 0;
const pScale = Math.max(...Array.from({ length: mediumModel.builder.nodeCount }, (_, n) => abs(physical.voltage(n))));
for (let n = 0; n < mediumModel.builder.nodeCount; n++) worstPhysical = Math.max(worstPhysical, abs(sub(physicalOurs.voltage(n), physical.voltage(n))) / pScale);
console.log(`  against mathjs on the physical network (independent assembly): ${worstPhysical.toExponential(2)} relative (target ≤ 1e-8)`);
console.log(`Peak memory: ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MiB resident`);

// Issue 14: a 400-point sensitivity sweep on the large route (20 × 20: soil resistivity × link-box earth resistance), through the exploration runner.
// Run as the server runs it, in one compute worker thread (the bundle is built first, as the test suite does), then on this thread
// for comparison. Wall time depends on what else the machine runs; the CPU time (the whole process) is the work done.
{
  const { buildWorkers } = await import('../scripts/build-workers.mjs');
  await buildWorkers();
  const { runExploration } = await import('../src/lib/explore/run-exploration');
  const { closeComputePool, computesInWorkers } = await import('../src/lib/compute/compute-pool');
  const limits = JSON.parse(readFileSync(new URL('../tests/fixtures/limit-sets/demo-owner.json', import.meta.url), 'utf8'));
  const axes = [
    { input: { kind: 'soil-resistivity' as const }, fromValue: 20, toValue: 2000, points: 20 },
    { input: { kind: 'earth-resistance' as const, at: 'link-boxes' as const }, fromValue: 1, toValue: 20, points: 20 },
  ];
  const sweep = async (threads: string) => {
    process.env.COMPUTE_THREADS = threads;
    const where = computesInWorkers() ? 'in one compute worker thread' : 'on the request thread';
    const cpu0 = process.cpuUsage();
    const t0 = performance.now();
    let reports = 0;
    const r = await runExploration({ kind: 'sweep', study: large, limits, axes }, { onProgress: () => reports++ });
    const ms = performance.now() - t0;
    const cpu = process.cpuUsage(cpu0);
    await closeComputePool();
    const failed = r.kind === 'sweep' ? r.points.filter((p) => p.error).length : -1;
    return `${(ms / 1000).toFixed(2)} s wall, ${((cpu.user + cpu.system) / 1e6).toFixed(2)} s CPU ${where}; ${reports} progress reports; ${failed} points not calculable`;
  };
  console.log('400-point sweep on the large route (all 8 cases, checked against the demo limits; target < 5 s on one core):');
  console.log(`  as the server runs it: ${await sweep('1')}`);
  console.log(`  without workers:       ${await sweep('0')}`);
}
