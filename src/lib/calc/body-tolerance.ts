// Tolerable touch and step voltages by the body-current method of IEEE Std 80-2013
// (§8.3 surface-layer derating Cs, equations for E_touch and E_step; from memory).

export type BodyWeightKg = 50 | 70;

/** k in I_B = k/√ts: 0.116 for 50 kg, 0.157 for 70 kg (IEEE Std 80, Dalziel). */
const BODY_CURRENT_CONSTANT: Record<BodyWeightKg, number> = { 50: 0.116, 70: 0.157 };

/** Tolerable body current I_B = k/√ts, A, for a shock lasting ts seconds. */
export const tolerableBodyCurrentA = (durationS: number, bodyWeightKg: BodyWeightKg): number =>
  BODY_CURRENT_CONSTANT[bodyWeightKg] / Math.sqrt(durationS);

/** Surface-layer derating Cs = 1 − 0.09·(1 − ρ/ρs)/(2hs + 0.09). */
export const surfaceLayerFactor = (soilOhmM: number, surfaceOhmM: number, surfaceThicknessM: number): number =>
  1 - (0.09 * (1 - soilOhmM / surfaceOhmM)) / (2 * surfaceThicknessM + 0.09);

export interface ToleranceInput {
  soilResistivityOhmM: number;
  /** A crushed-rock or asphalt layer; omit when the person stands on native soil. */
  surfaceLayer?: { resistivityOhmM: number; thicknessM: number };
  durationS: number;
  bodyWeightKg: BodyWeightKg;
}

/** E_touch = (1000 + 1.5·Cs·ρs)·k/√ts and E_step = (1000 + 6·Cs·ρs)·k/√ts, V. */
export function tolerableVoltages(input: ToleranceInput) {
  const rhoS = input.surfaceLayer?.resistivityOhmM ?? input.soilResistivityOhmM;
  const cs = input.surfaceLayer
    ? surfaceLayerFactor(input.soilResistivityOhmM, input.surfaceLayer.resistivityOhmM, input.surfaceLayer.thicknessM)
    : 1;
  const ib = tolerableBodyCurrentA(input.durationS, input.bodyWeightKg);
  return {
    surfaceFactor: cs,
    bodyCurrentA: ib,
    touchV: (1000 + 1.5 * cs * rhoS) * ib,
    stepV: (1000 + 6 * cs * rhoS) * ib,
  };
}
