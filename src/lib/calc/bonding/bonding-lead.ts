import type { BondingStudy } from '../../schemas/bonding-study.schema';
import type { Complex } from '../complex';
import { atTemperature, CONDUCTOR_METALS, resistanceOhmPerKm, TABLE_1_SOURCE } from '../cable/materials';
import { type DerivedFigure, sig } from '../cable/derive-cable';

// The impedance of one cross-bonding lead, as the network uses it: the total the designer
// typed, or length × per-metre figures, where the resistance per metre may come from the lead's
// conductor (cross-section and material) and the resistivity of the metal.

const EQ2 = 'IEC 60287-1-1 §2.1.1, eq. (2), with α20 from Table 1';

/** Lead impedance, Ω, with the steps that led to it (empty when typed as a total). */
export interface BondingLeadImpedance {
  ohm: Complex;
  figures: DerivedFigure[];
}

type LeadFields = Pick<BondingStudy, 'bondingLeadMilliohm' | 'bondingLeadLength' | 'bondingLeads' | 'adiabatic'>;

/**
 * The impedance of each cross-bonding lead, Ω. Given by length without a resistance per metre,
 * the resistance is ρ20/A of the lead's conductor (`bondingLeads`), at the initial temperature
 * of the adiabatic check (the lead's temperature in service before a fault). The study has
 * been checked: a lead by length without a resistance per metre has `bondingLeads`.
 */
export function bondingLeadImpedance(study: LeadFields): BondingLeadImpedance {
  const byLength = study.bondingLeadLength;
  if (!byLength) {
    const total = study.bondingLeadMilliohm ?? { r: 0, x: 0 };
    return { ohm: { re: total.r / 1000, im: total.x / 1000 }, figures: [] };
  }
  const figures: DerivedFigure[] = [];
  const add = (f: DerivedFigure): number => (figures.push(f), f.value);
  const lengthM = byLength.lengthM;
  let rPerM: number;
  if (byLength.resistanceMilliohmPerM !== undefined) {
    rPerM = byLength.resistanceMilliohmPerM;
  } else {
    const lead = study.bondingLeads!;
    const metal = CONDUCTOR_METALS[lead.material];
    const r20 = add({ key: 'leadR20', label: `Lead resistance at 20 °C (${lead.crossSectionMm2} mm² ${metal.label})`, value: resistanceOhmPerKm(metal.resistivity20OhmM, lead.crossSectionMm2), unit: 'Ω/km', formula: 'R20 = ρ20 / A', working: `R20 = ${metal.resistivity20OhmM.toExponential(4)} Ω·m / ${sig(lead.crossSectionMm2)} mm²`, source: `${TABLE_1_SOURCE}, on the nominal area (IEC 60228's maxima allow a few per cent more)` });
    const theta = study.adiabatic.initialC;
    const hot = add({ key: 'leadR', label: `Lead resistance at ${theta} °C (the adiabatic check's initial temperature)`, value: atTemperature(r20, metal.alpha20PerK, theta), unit: 'Ω/km', formula: 'R = R20·[1 + α20·(θ − 20)]', working: `R = ${sig(r20)}·[1 + ${metal.alpha20PerK}·(${theta} − 20)]`, source: EQ2 });
    rPerM = hot; // Ω/km equals mΩ/m
  }
  const xPerM = byLength.reactanceMilliohmPerM ?? 0;
  const rMilliohm = add({ key: 'leadRTotal', label: 'Lead resistance', value: rPerM * lengthM, unit: 'mΩ', formula: 'R = r′·L', working: `R = ${sig(rPerM)} mΩ/m × ${sig(lengthM)} m`, source: 'series resistance of a uniform conductor (common practice)' });
  const xMilliohm = add({ key: 'leadXTotal', label: 'Lead reactance', value: xPerM * lengthM, unit: 'mΩ', formula: 'X = x′·L', working: `X = ${sig(xPerM)} mΩ/m × ${sig(lengthM)} m`, source: 'series reactance of a uniform conductor (common practice)' });
  return { ohm: { re: rMilliohm / 1000, im: xMilliohm / 1000 }, figures };
}
