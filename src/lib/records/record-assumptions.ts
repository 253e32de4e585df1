import type { Study } from '../calc';
import { earthReturnDepthM } from '../calc/earth-return';
import { formatNumber } from '../format';

/** Assumptions and limitations of the calculation, generated from the study's own inputs. */
export function assumptions(s: Study): string[] {
  const de = earthReturnDepthM(s.soilResistivityOhmM, s.frequencyHz);
  const common = [
    `Steady state at ${formatNumber(s.frequencyHz)} Hz, sinusoidal: harmonics and switching or lightning transients are not calculated.`,
    `The soil is one homogeneous layer of ${formatNumber(s.soilResistivityOhmM)} Ω·m; earth return follows Carson's equations in their simplified form, with an equivalent earth-return depth of ${formatNumber(de)} m. Layered soil is not modelled.`,
  ];
  if (s.kind === 'exposure') {
    return [
      ...common,
      `The exposed metalwork (${s.object.name}) runs parallel to the sources over ${formatNumber(s.object.parallelLengthM)} m; coupling at its ends and along oblique approaches is not modelled. Its screening factor is ${formatNumber(s.object.screeningFactor)} as entered.`,
      'Only inductive coupling is calculated: capacitive (electric-field) coupling and conductive coupling through the soil are not modelled.',
    ];
  }
  const faults = s.cases.filter((c) => c.kind !== 'normal' && c.kind !== 'emergency').length;
  return [
    ...common,
    'Only series (longitudinal) coupling is modelled: the cables\' capacitive charging current and the sheath-to-earth capacitance are left out.',
    `Earth electrodes are lumped resistances to remote earth (route start ${formatNumber(s.earthing.routeStartOhm)} Ω, route end ${formatNumber(s.earthing.routeEndOhm)} Ω, link boxes ${formatNumber(s.earthing.linkBoxOhm)} Ω${s.earthing.overrides.length ? `, ${s.earthing.overrides.length} joint(s) as entered` : ''}); mutual resistance between electrodes is not modelled.`,
    `Core currents are as entered for each case; balanced cases are positive-sequence sets. ${faults ? `${faults} fault case(s) use the currents and durations entered, not a network fault study.` : 'No fault case is entered: fault voltages across joints and SVLs are not assessed.'}`,
    s.svls.length ? `SVLs are modelled as blocking (a high leakage resistance) below their continuous rating and as conducting above it; their energy is an estimate (V·I·t).` : 'No SVLs are entered.',
    s.eccs.length ? `${s.eccs.length} ECC(s) are modelled as conductors in the cross-section with their own resistance and GMR.` : 'No ECC is entered.',
    'Voltages are r.m.s.: "to remote earth" is to earth far away; "to local earth" is to the electrode or station grid at that point.',
  ];
}
