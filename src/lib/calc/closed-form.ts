import { type Complex, abs, scale, sub } from './complex';
import { MU0_OVER_2PI, angularFrequency } from './constants';

// Closed-form sheath formulas for balanced currents, used beside the network solve as an
// independent cross-check. Sources: IEC 60287-1-1:2006 §2.3 (reactances, loss factors);
// IEEE Std 575-2014; CIGRE TB 283 (2005) and Electra 28/47/128 (cross-bonding residuals).

const j = (z: Complex): Complex => ({ re: -z.im, im: z.re });

/** X = 2ω·1e-7·ln(2s/d), Ω/m: sheath reactance per metre for cables s apart, mean sheath diameter d. */
export function sheathReactanceOhmPerM(frequencyHz: number, spacingM: number, sheathMeanDiameterM: number): number {
  return angularFrequency(frequencyHz) * MU0_OVER_2PI * Math.log((2 * spacingM) / sheathMeanDiameterM);
}

/** Xm = 2ω·1e-7·ln 2, Ω/m: the extra mutual reactance between an outer cable and the far outer cable in flat formation. */
export const flatMutualReactanceOhmPerM = (frequencyHz: number): number =>
  angularFrequency(frequencyHz) * MU0_OVER_2PI * Math.LN2;

/** X1 = 2ω·1e-7·ln(2·2^(1/3)·s/d), Ω/m: flat formation, regularly transposed. */
export function transposedFlatReactanceOhmPerM(frequencyHz: number, spacingM: number, sheathMeanDiameterM: number): number {
  return sheathReactanceOhmPerM(frequencyHz, 2 ** (1 / 3) * spacingM, sheathMeanDiameterM);
}

/** Trefoil: E_k = jX·I_k, V/m. */
export const trefoilSheathEmf = (phaseCurrentsA: Complex[], xOhmPerM: number): Complex[] =>
  phaseCurrentsA.map((i) => j(scale(i, xOhmPerM)));

/** Flat, b in the middle, not transposed: E_a = j(X·I_a − Xm·I_c), E_b = jX·I_b, E_c = j(X·I_c − Xm·I_a), V/m. */
export function flatSheathEmf([ia, ib, ic]: Complex[], xOhmPerM: number, xmOhmPerM: number): Complex[] {
  return [
    j(sub(scale(ia, xOhmPerM), scale(ic, xmOhmPerM))),
    j(scale(ib, xOhmPerM)),
    j(sub(scale(ic, xOhmPerM), scale(ia, xmOhmPerM))),
  ];
}

/** Solid bonding, trefoil or transposed flat (pass X1): loss factor λ1' = (Rs/R)/(1 + (Rs/X)²) and sheath current Is = I·X/√(Rs² + X²). */
export function solidBondingLoss(sheathROhmPerM: number, conductorROhmPerM: number, xOhmPerM: number, currentA: number) {
  return {
    lossFactor: sheathROhmPerM / conductorROhmPerM / (1 + (sheathROhmPerM / xOhmPerM) ** 2),
    sheathCurrentA: (currentA * xOhmPerM) / Math.hypot(sheathROhmPerM, xOhmPerM),
  };
}

/**
 * Solid bonding, flat formation not transposed (IEC 60287-1-1:2006 §2.3.2, from memory):
 * P = X + Xm, Q = X − Xm/3; loss factors of the outer cable carrying the lagging phase, the
 * outer cable carrying the leading phase, and the middle cable.
 */
export function solidBondingFlatLoss(sheathROhmPerM: number, conductorROhmPerM: number, xOhmPerM: number, xmOhmPerM: number) {
  const rs = sheathROhmPerM;
  const p = xOhmPerM + xmOhmPerM;
  const q = xOhmPerM - xmOhmPerM / 3;
  const k = rs / conductorROhmPerM;
  const base = (q * q) / 4 / (rs * rs + q * q) + (3 * p * p) / 4 / (rs * rs + p * p);
  const cross = (2 * rs * p * q * xmOhmPerM) / (Math.sqrt(3) * (rs * rs + p * p) * (rs * rs + q * q));
  return {
    outerLagging: k * (base + cross),
    outerLeading: k * (base - cross),
    middle: (k * q * q) / (rs * rs + q * q),
  };
}

/** √(a² + b² + c² − ab − bc − ca), m: the length-weighted imbalance of a major section's minor lengths. */
export const crossBondImbalanceM = (a: number, b: number, c: number): number =>
  Math.sqrt(a * a + b * b + c * c - a * b - b * c - c * a);

/** Residual EMF of one cross-bonded sheath path, V, for a balanced per-metre EMF E (V/m). */
export const crossBondResidualV = (emfVPerM: number, a: number, b: number, c: number): number =>
  emfVPerM * crossBondImbalanceM(a, b, c);

/** Circulating current in a cross-bonded major section: E_res / ((a+b+c)·|Rs + jX|), A. */
export function crossBondCurrentA(emfVPerM: number, a: number, b: number, c: number, sheathROhmPerM: number, xOhmPerM: number) {
  return crossBondResidualV(emfVPerM, a, b, c) / ((a + b + c) * Math.hypot(sheathROhmPerM, xOhmPerM));
}

/** Loss multiplier of a cross-bonded major section against solid bonding: (a²+b²+c²−ab−bc−ca)/(a+b+c)². */
export const crossBondLossMultiplier = (a: number, b: number, c: number): number =>
  crossBondImbalanceM(a, b, c) ** 2 / (a + b + c) ** 2;

/** Open-end standing voltage of a single-point bonded run of length L: |E|·L, V. */
export const singlePointOpenEndV = (emf: Complex, lengthM: number): number => abs(emf) * lengthM;

/** Voltage across a sectionalising joint whose two sheath ends stand at V to earth, 120° apart: √3·V. */
export const sectionalisingJointV = (sheathToEarthV: number): number => Math.sqrt(3) * sheathToEarthV;

