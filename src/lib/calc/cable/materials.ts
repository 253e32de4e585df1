/**
 * Electrical resistivity at 20 °C (Ω·m) and temperature coefficient of resistance at 20 °C
 * (1/K) of the metals in cables: IEC 60287-1-1:2006+A1:2014, Table 1 (values from memory).
 * The standard gives aluminium sheaths a slightly higher resistivity than aluminium
 * conductors, and calls stainless steel's coefficient negligible (taken as 0 here).
 */
export interface Metal {
  label: string;
  resistivity20OhmM: number;
  alpha20PerK: number;
}

export const CONDUCTOR_METALS = {
  copper: { label: 'copper', resistivity20OhmM: 1.7241e-8, alpha20PerK: 3.93e-3 },
  aluminium: { label: 'aluminium', resistivity20OhmM: 2.8264e-8, alpha20PerK: 4.03e-3 },
} as const satisfies Record<string, Metal>;

export const SHEATH_METALS = {
  lead: { label: 'lead or lead alloy', resistivity20OhmM: 21.4e-8, alpha20PerK: 4.0e-3 },
  aluminium: { label: 'aluminium', resistivity20OhmM: 2.84e-8, alpha20PerK: 4.03e-3 },
  copper: { label: 'copper', resistivity20OhmM: 1.7241e-8, alpha20PerK: 3.93e-3 },
  'stainless-steel': { label: 'stainless steel', resistivity20OhmM: 70e-8, alpha20PerK: 0 },
  steel: { label: 'steel', resistivity20OhmM: 13.8e-8, alpha20PerK: 4.5e-3 },
  bronze: { label: 'bronze', resistivity20OhmM: 3.5e-8, alpha20PerK: 3.0e-3 },
} as const satisfies Record<string, Metal>;

export type ConductorMetal = keyof typeof CONDUCTOR_METALS;
export type SheathMetal = keyof typeof SHEATH_METALS;

export const conductorMetals = Object.keys(CONDUCTOR_METALS) as [ConductorMetal, ...ConductorMetal[]];
export const sheathMetals = Object.keys(SHEATH_METALS) as [SheathMetal, ...SheathMetal[]];

export const TABLE_1_SOURCE = 'IEC 60287-1-1:2006+A1:2014, Table 1 (resistivity and temperature coefficient at 20 °C)';

/** d.c. resistance of a metal path, Ω/km, from its resistivity (Ω·m) and its cross-section (mm²). */
export const resistanceOhmPerKm = (resistivityOhmM: number, areaMm2: number): number => (resistivityOhmM / (areaMm2 * 1e-6)) * 1000;

/** Resistance at θ from that at 20 °C: R = R20·[1 + α20·(θ − 20)], IEC 60287-1-1 §2.1.1, eq. (2). */
export const atTemperature = (r20: number, alpha20PerK: number, temperatureC: number): number => r20 * (1 + alpha20PerK * (temperatureC - 20));
