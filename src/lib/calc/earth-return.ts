import type { Complex } from './complex';
import { CARSON_DEPTH_COEFFICIENT, MU0_OVER_2PI, angularFrequency } from './constants';

// Carson's equations, simplified for D ≪ De at power frequency, homogeneous soil:
// Carson (1926); IEEE Std 367; W. H. Kersting, Distribution System Modeling and Analysis, ch. 4.

/** Equivalent earth-return depth De = 658.5·√(ρ/f), metres. */
export function earthReturnDepthM(soilResistivityOhmM: number, frequencyHz: number): number {
  return CARSON_DEPTH_COEFFICIENT * Math.sqrt(soilResistivityOhmM / frequencyHz);
}

/** Earth-return resistance per metre, π²·f·1e-7 Ω/m. */
export const earthReturnResistanceOhmPerM = (frequencyHz: number): number => Math.PI ** 2 * frequencyHz * 1e-7;

/** Mutual impedance with earth return between parallel conductors D apart, Ω/m. */
export function mutualImpedanceOhmPerM(distanceM: number, frequencyHz: number, soilResistivityOhmM: number): Complex {
  const de = earthReturnDepthM(soilResistivityOhmM, frequencyHz);
  return {
    re: earthReturnResistanceOhmPerM(frequencyHz),
    im: angularFrequency(frequencyHz) * MU0_OVER_2PI * Math.log(de / distanceM),
  };
}

/** Self impedance with earth return of a conductor of resistance R (Ω/m) and geometric mean radius GMR, Ω/m. */
export function selfImpedanceOhmPerM(
  resistanceOhmPerM: number,
  gmrM: number,
  frequencyHz: number,
  soilResistivityOhmM: number,
): Complex {
  const m = mutualImpedanceOhmPerM(gmrM, frequencyHz, soilResistivityOhmM);
  return { re: resistanceOhmPerM + m.re, im: m.im };
}

/** A conductor in a cross-section: position, and for metallic paths its resistance and GMR. */
export interface LongitudinalConductor {
  xM: number;
  yM: number;
  resistanceOhmPerM: number;
  gmrM: number;
}

/**
 * The full per-unit-length impedance matrix (row-major, n×n, Ω/m) of parallel conductors with
 * earth return. `distanceOverride(i, j)` may return a distance for pairs that share an axis
 * (a core and its own sheath: the sheath's mean radius), or undefined to use the geometry.
 */
export function impedanceMatrix(
  conductors: LongitudinalConductor[],
  frequencyHz: number,
  soilResistivityOhmM: number,
  distanceOverride: (i: number, j: number) => number | undefined = () => undefined,
): Complex[][] {
  return conductors.map((a, i) =>
    conductors.map((b, j) => {
      if (i === j) return selfImpedanceOhmPerM(a.resistanceOhmPerM, a.gmrM, frequencyHz, soilResistivityOhmM);
      const d = distanceOverride(i, j) ?? Math.hypot(a.xM - b.xM, a.yM - b.yM);
      return mutualImpedanceOhmPerM(d, frequencyHz, soilResistivityOhmM);
    }),
  );
}
