// Adiabatic short-circuit rating of a conductor: I²·t = K²·S²·ln((θf + β)/(θi + β)),
// IEC 60949:1988 eq. (1) with the constants of its Table I (from memory): copper K = 226
// A·s½/mm², β = 234.5 K; aluminium K = 148 A·s½/mm², β = 228 K. The same form is IEEE Std
// 80-2013 eq. 37 for earthing conductors.

export type ConductorMaterial = 'copper' | 'aluminium';

export const ADIABATIC_CONSTANTS: Record<ConductorMaterial, { k: number; betaK: number }> = {
  copper: { k: 226, betaK: 234.5 },
  aluminium: { k: 148, betaK: 228 },
};

/** Largest r.m.s. current, A, a conductor of S mm² carries for t s heating from θi to θf °C without losing heat. */
export function adiabaticCurrentA(material: ConductorMaterial, crossSectionMm2: number, durationS: number, initialC: number, finalC: number): number {
  const { k, betaK } = ADIABATIC_CONSTANTS[material];
  return k * crossSectionMm2 * Math.sqrt(Math.log((finalC + betaK) / (initialC + betaK)) / durationS);
}

/** Smallest cross-section, mm², for a current I A lasting t s (the same equation solved for S). */
export function adiabaticCrossSectionMm2(material: ConductorMaterial, currentA: number, durationS: number, initialC: number, finalC: number): number {
  return currentA / adiabaticCurrentA(material, 1, durationS, initialC, finalC);
}
