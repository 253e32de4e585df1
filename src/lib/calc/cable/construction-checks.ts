import type { CableConstruction } from '../../schemas/bonding-study.schema';
import { strandCounts } from './conductor';
import { CONDUCTOR_METALS, resistanceOhmPerKm } from './materials';

export interface ConstructionIssue {
  path: Array<string | number>;
  message: string;
}

/** The fields of a cable type the construction checks need. */
export interface ConstructionCableFields {
  construction: CableConstruction;
  oversheathThicknessMm: number;
  overallDiameterMm: number;
}

/**
 * Cross-field rules of a construction, each reported on the field to change. Runs once every
 * field is valid on its own, so the numbers can be trusted.
 */
export function checkCableConstruction(t: ConstructionCableFields): ConstructionIssue[] {
  const issues: ConstructionIssue[] = [];
  const report = (path: Array<string | number>, message: string) => issues.push({ path: ['construction', ...path], message });
  const k = t.construction.conductor;
  const s = t.construction.screen;

  // The nominal area must fit in the circle; below half of it the diameter or area is mistyped.
  const fill = k.crossSectionMm2 / ((Math.PI * k.diameterMm ** 2) / 4);
  if (fill > 1.02) report(['conductor', 'diameterMm'], `A ${k.crossSectionMm2} mm² conductor needs at least ${Math.sqrt((4 * k.crossSectionMm2) / Math.PI).toFixed(1)} mm diameter: check the diameter or the cross-section.`);
  else if (fill < 0.5) report(['conductor', 'diameterMm'], `A ${k.diameterMm} mm conductor would be less than half filled by ${k.crossSectionMm2} mm²: check the diameter or the cross-section.`);

  if (k.stranding === 'stranded' && !strandCounts.includes(k.strandCount ?? -1))
    report(['conductor', 'strandCount'], `Give the strand count of the concentric lay: one of ${strandCounts.join(', ')}.`);
  if (k.stranding !== 'stranded' && k.strandCount !== undefined) report(['conductor', 'strandCount'], 'A strand count applies to stranded conductors only: clear it or choose "stranded".');
  if (k.stranding === 'segmental' && ![4, 5, 6].includes(k.segmentCount ?? -1)) report(['conductor', 'segmentCount'], 'Give the number of segments: 4, 5 or 6.');
  if (k.stranding !== 'segmental' && k.segmentCount !== undefined) report(['conductor', 'segmentCount'], 'A segment count applies to segmental conductors only: clear it or choose "segmental".');

  // A figure far from the metal's own ρ/A is a unit slip (Ω/m for Ω/km) or the wrong metal.
  if (k.resistance20OhmPerKm !== undefined) {
    const metalOnly = resistanceOhmPerKm(CONDUCTOR_METALS[k.material].resistivity20OhmM, k.crossSectionMm2);
    if (k.resistance20OhmPerKm < 0.95 * metalOnly || k.resistance20OhmPerKm > 1.3 * metalOnly)
      report(['conductor', 'resistance20OhmPerKm'], `${k.crossSectionMm2} mm² of ${k.material} has about ${metalOnly.toPrecision(3)} Ω/km at 20 °C; ${k.resistance20OhmPerKm} Ω/km is not within −5 %/+30 % of it: check the units (Ω/km) or the material.`);
  }

  // The screen carries heat outwards from the conductor, so it cannot run hotter.
  if (s.operatingTemperatureC > k.operatingTemperatureC) report(['screen', 'operatingTemperatureC'], 'The screen cannot run hotter than the conductor it surrounds.');

  const screenInnerMm = s.kind === 'tubular' ? s.meanDiameterMm - s.thicknessMm : s.diameterUnderWiresMm;
  const screenOuterMm = s.kind === 'tubular' ? s.meanDiameterMm + s.thicknessMm : s.diameterUnderWiresMm + 2 * s.wireDiameterMm + 2 * (s.foil?.thicknessMm ?? 0);
  if (screenInnerMm <= k.diameterMm)
    report(['screen', s.kind === 'tubular' ? 'meanDiameterMm' : 'diameterUnderWiresMm'], `The screen must lie outside the ${k.diameterMm} mm conductor and its insulation: its inside diameter is ${screenInnerMm.toFixed(1)} mm.`);
  if (s.kind === 'wires' && s.wireCount * s.wireDiameterMm > Math.PI * (s.diameterUnderWiresMm + s.wireDiameterMm))
    report(['screen', 'wireCount'], `${s.wireCount} wires of ${s.wireDiameterMm} mm do not fit around a ${s.diameterUnderWiresMm} mm core in one layer.`);
  const minOverallMm = screenOuterMm + 2 * t.oversheathThicknessMm;
  if (t.overallDiameterMm < minOverallMm * 0.999)
    issues.push({ path: ['overallDiameterMm'], message: `The screen's outside diameter (${screenOuterMm.toFixed(1)} mm) plus twice the oversheath makes at least ${minOverallMm.toFixed(1)} mm: check the overall diameter.` });
  return issues;
}
