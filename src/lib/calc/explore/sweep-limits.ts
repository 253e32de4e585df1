// In a module of its own, without imports, so the request schema and the Explore form share the
// one limit without bringing the calculation into the browser.

/** Largest grid: at some 10 ms a point on the reference large route, 1,000 points is about 10 s of one core. */
export const SWEEP_LIMITS = { maxPoints: 1000, maxPointsPerAxis: 200, maxAxes: 2 } as const;

/** The number of grid points a sweep of these axes calculates. */
export const gridPointCount = (axes: ReadonlyArray<{ points: number }>) => axes.reduce((n, a) => n * a.points, 1);
