import { MU0_OVER_2PI } from './constants';

// Finite straight conductors: E. B. Rosa, Bulletin of the Bureau of Standards 4 (1908);
// F. W. Grover, Inductance Calculations (1946). They show where the per-unit-length form
// (infinitely long conductors) stops being accurate.

/** Mutual inductance of two equal parallel filaments of length l, d apart, H. */
export function parallelFilamentMutualH(lengthM: number, separationM: number): number {
  const l = lengthM;
  const d = separationM;
  return (
    MU0_OVER_2PI * l * (Math.log(l / d + Math.sqrt(1 + (l * l) / (d * d))) - Math.sqrt(1 + (d * d) / (l * l)) + d / l)
  );
}

/** Self inductance of a straight round non-magnetic wire of length l and radius r (low frequency), H. */
export function straightWireSelfH(lengthM: number, radiusM: number): number {
  return MU0_OVER_2PI * lengthM * (Math.log((2 * lengthM) / radiusM) - 0.75);
}
