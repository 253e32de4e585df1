import { describe, expect, it } from 'vitest';
import demoLimits from '../../fixtures/limit-sets/demo-owner.json';
import type { LimitSet } from '../../../src/lib/schemas/limit-set.schema';
import { runExploration } from '../../../src/lib/explore/run-exploration';
import { sweepPoint, type SweepAxis } from '../../../src/lib/calc/explore';
import { computesInWorkers } from '../../../src/lib/compute/compute-pool';
import { referenceStudy } from '../../helpers/reference-study';

const limits = demoLimits as LimitSet;
const axes: SweepAxis[] = [{ input: { kind: 'load-current' }, fromValue: 200, toValue: 3000, points: 60 }];

describe('exploration runner', () => {
  it('runs a sweep in chunks, reports progress up to the total and returns every point as the core computes it', async () => {
    // The suite builds the worker bundle (tests/helpers/build-workers.setup.ts): the points come
    // from worker threads, and must equal the same point computed on this thread.
    expect(computesInWorkers()).toBe(true);
    const seen: number[] = [];
    const r = await runExploration({ kind: 'sweep', study: referenceStudy(), limits, axes }, { onProgress: (p) => (expect(p.total).toBe(60), seen.push(p.done)) });
    if (r.kind !== 'sweep') throw new Error('wrong kind');
    expect(seen[0]).toBe(0);
    expect(seen.at(-1)).toBe(60);
    expect([...seen].sort((a, b) => a - b)).toEqual(seen);
    expect(r.points[17]).toEqual(sweepPoint(referenceStudy(), limits, axes, 17));
    expect(r.axes[0].baseValue).toBe(1000);
  });

  it('stops when cancelled, and lets other work run between chunks', async () => {
    const controller = new AbortController();
    let ticks = 0;
    const timer = setInterval(() => ticks++, 1);
    const big: SweepAxis[] = [{ input: { kind: 'soil-resistivity' }, fromValue: 10, toValue: 1000, points: 200 }, { input: { kind: 'load-current' }, fromValue: 100, toValue: 2000, points: 5 }];
    const run = runExploration({ kind: 'sweep', study: referenceStudy(), limits, axes: big }, { signal: controller.signal, onProgress: (p) => p.done > 50 && controller.abort() });
    await expect(run).rejects.toThrow(/cancel|abort/i);
    clearInterval(timer);
    expect(ticks).toBeGreaterThan(0);
  });

  it('refuses a grid over the limit before computing anything', async () => {
    let calls = 0;
    const big: SweepAxis[] = [{ input: { kind: 'soil-resistivity' }, fromValue: 10, toValue: 1000, points: 200 }, { input: { kind: 'load-current' }, fromValue: 100, toValue: 2000, points: 6 }];
    await expect(runExploration({ kind: 'sweep', study: referenceStudy(), limits, axes: big }, { onProgress: () => calls++ })).rejects.toThrow('A sweep of 1,200 grid points is over the limit of 1,000; use fewer points.');
    expect(calls).toBe(0);
  });
});
