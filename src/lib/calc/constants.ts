/** μ0/2π in H/m (reference conventions: 2e-7 exactly). */
export const MU0_OVER_2PI = 2e-7;

/**
 * Carson's equivalent earth-return depth coefficient: De = 658.5·√(ρ/f) m. We use the usual
 * rounded value (Carson 1926, as simplified in IEEE Std 367 and Kersting ch. 4); the exact
 * 658.87 differs by 5.6e-4 in ln(De/D).
 */
export const CARSON_DEPTH_COEFFICIENT = 658.5;

/** The engine's version, stored with every result so a recomputation can be compared. */
export const ENGINE_VERSION = '2.0.0';

export const angularFrequency = (frequencyHz: number): number => 2 * Math.PI * frequencyHz;
