/**
 * A.c. current density at a circular coating defect of diameter d on a pipeline standing at
 * V_ac: J = 8·V/(ρ·π·d), A/m², from the spread resistance ρ/(2d) of a disc (widely used in
 * a.c. corrosion assessment; from memory).
 */
export function acCurrentDensityAPerM2(voltageV: number, soilResistivityOhmM: number, defectDiameterM: number): number {
  return (8 * voltageV) / (soilResistivityOhmM * Math.PI * defectDiameterM);
}
