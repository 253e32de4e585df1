import type { CableConstruction } from '../../schemas/bonding-study.schema';
import { gmrFactor, skinEffectArgumentSquared, skinEffectFactor, skinEffectKs } from './conductor';
import { atTemperature, CONDUCTOR_METALS, resistanceOhmPerKm, SHEATH_METALS, TABLE_1_SOURCE } from './materials';
import { layLengthFactor, parallelLayers, tubeAreaMm2, wireLayerMeanDiameterMm, wiresAreaMm2 } from './screen';

/** One derived figure with the formula, the working and where the formula comes from. */
export interface DerivedFigure {
  key: string;
  label: string;
  value: number;
  unit: string;
  formula: string;
  working: string;
  source: string;
}

/** The engine's four construction-dependent figures, plus every step that led to them. */
export interface DerivedCable {
  conductorResistanceOhmPerKm: number;
  conductorGmrMm: number;
  sheathMeanDiameterMm: number;
  sheathResistanceOhmPerKm: number;
  figures: DerivedFigure[];
}

export const DERIVED_ENGINE_FIELDS = ['conductorResistanceOhmPerKm', 'conductorGmrMm', 'sheathMeanDiameterMm', 'sheathResistanceOhmPerKm'] as const;

/** Four significant figures, for the working shown beside a formula (the value keeps full precision). */
export const sig = (v: number): string => String(Number(v.toPrecision(4)));

const EQ2 = 'IEC 60287-1-1 §2.1.1, eq. (2), with α20 from Table 1';

/** Derives the engine's figures from a construction. Pure; the input is already validated. */
export function deriveCableParameters(c: CableConstruction): DerivedCable {
  const figures: DerivedFigure[] = [];
  const add = (f: DerivedFigure): number => (figures.push(f), f.value);
  const k = c.conductor;
  const metal = CONDUCTOR_METALS[k.material];

  const r20 =
    k.resistance20OhmPerKm !== undefined
      ? add({ key: 'conductorR20', label: 'Conductor d.c. resistance at 20 °C', value: k.resistance20OhmPerKm, unit: 'Ω/km', formula: 'R0 (given)', working: `R0 = ${sig(k.resistance20OhmPerKm)} Ω/km`, source: 'Given: IEC 60228 maximum or the maker\'s figure' })
      : add({ key: 'conductorR20', label: 'Conductor d.c. resistance at 20 °C', value: resistanceOhmPerKm(metal.resistivity20OhmM, k.crossSectionMm2), unit: 'Ω/km', formula: 'R0 = ρ20 / A', working: `R0 = ${metal.resistivity20OhmM.toExponential(4)} Ω·m / ${sig(k.crossSectionMm2)} mm²`, source: `${TABLE_1_SOURCE}, on the nominal area (IEC 60228's maxima allow a few per cent more)` });
  const rDc = add({ key: 'conductorRdc', label: `Conductor d.c. resistance at ${k.operatingTemperatureC} °C`, value: atTemperature(r20, metal.alpha20PerK, k.operatingTemperatureC), unit: 'Ω/km', formula: "R' = R0·[1 + α20·(θ − 20)]", working: `R' = ${sig(r20)}·[1 + ${metal.alpha20PerK}·(${k.operatingTemperatureC} − 20)]`, source: EQ2 });
  const ks = skinEffectKs(k.material, k.stranding, k.segmentCount);
  const xs2 = skinEffectArgumentSquared(c.frequencyHz, rDc / 1000, ks);
  const xs = add({ key: 'conductorXs', label: 'Skin-effect argument xs', value: Math.sqrt(xs2), unit: '', formula: "xs² = 8πf/R'·10⁻⁷·ks (R' in Ω/m)", working: `xs² = 8π·${c.frequencyHz}/${(rDc / 1000).toExponential(4)}·10⁻⁷·${ks}`, source: `IEC 60287-1-1 §2.1.2; ks = ${ks} from Table 2 (${k.material}, ${k.stranding}) (from memory)` });
  const ys = add({ key: 'conductorYs', label: 'Skin-effect factor ys', value: skinEffectFactor(xs), unit: '', formula: xs <= 2.8 ? 'ys = xs⁴ / (192 + 0.8·xs⁴)' : xs <= 3.8 ? 'ys = −0.136 − 0.0177·xs + 0.0563·xs²' : 'ys = 0.354·xs − 0.733', working: `xs = ${sig(xs)}`, source: 'IEC 60287-1-1 §2.1.2' });
  const rAc = add({ key: 'conductorResistanceOhmPerKm', label: `Conductor a.c. resistance at ${k.operatingTemperatureC} °C, ${c.frequencyHz} Hz`, value: rDc * (1 + ys), unit: 'Ω/km', formula: "R = R'·(1 + ys)", working: `R = ${sig(rDc)}·(1 + ${sig(ys)})`, source: 'IEC 60287-1-1 §2.1, eq. (1), without the proximity factor yp, which depends on the layout (its omission makes λ1 slightly larger, the safe side)' });
  const g = gmrFactor(k.stranding, k.strandCount);
  const gmr = add({ key: 'conductorGmrMm', label: 'Conductor geometric mean radius', value: (g.factor * k.diameterMm) / 2, unit: 'mm', formula: 'GMR = k·dc/2', working: `GMR = ${sig(g.factor)}·${sig(k.diameterMm)}/2`, source: g.source });

  const sheath = deriveScreen(c.screen, add);
  return { conductorResistanceOhmPerKm: rAc, conductorGmrMm: gmr, sheathMeanDiameterMm: sheath.meanDiameterMm, sheathResistanceOhmPerKm: sheath.resistanceOhmPerKm, figures };
}

function deriveScreen(s: CableConstruction['screen'], add: (f: DerivedFigure) => number): { meanDiameterMm: number; resistanceOhmPerKm: number } {
  const metal = SHEATH_METALS[s.material];
  const hot = (key: string, label: string, r20: number, alpha: number): number =>
    add({ key, label: `${label} at ${s.operatingTemperatureC} °C`, value: atTemperature(r20, alpha, s.operatingTemperatureC), unit: 'Ω/km', formula: 'Rs = Rs20·[1 + α20·(θs − 20)]', working: `Rs = ${sig(r20)}·[1 + ${alpha}·(${s.operatingTemperatureC} − 20)]`, source: EQ2 });

  if (s.kind === 'tubular') {
    const area = add({ key: 'sheathAreaMm2', label: 'Sheath cross-section', value: tubeAreaMm2(s.meanDiameterMm, s.thicknessMm), unit: 'mm²', formula: 'As = π·d·ts', working: `As = π·${sig(s.meanDiameterMm)}·${sig(s.thicknessMm)}`, source: 'Geometry of a tube of mean diameter d (exact)' });
    const r20 = add({ key: 'sheathR20', label: `Sheath resistance at 20 °C (${metal.label})`, value: resistanceOhmPerKm(metal.resistivity20OhmM, area), unit: 'Ω/km', formula: 'Rs20 = ρ20 / As', working: `Rs20 = ${metal.resistivity20OhmM.toExponential(4)} Ω·m / ${sig(area)} mm²`, source: TABLE_1_SOURCE });
    const r = hot('sheathResistanceOhmPerKm', 'Sheath resistance', r20, metal.alpha20PerK);
    const d = add({ key: 'sheathMeanDiameterMm', label: 'Sheath mean diameter', value: s.meanDiameterMm, unit: 'mm', formula: 'd (given)', working: `d = ${sig(s.meanDiameterMm)} mm`, source: 'Given (maker\'s data)' });
    return { meanDiameterMm: d, resistanceOhmPerKm: r };
  }

  const dWires = add({ key: 'wiresMeanDiameterMm', label: 'Mean diameter of the wire layer', value: wireLayerMeanDiameterMm(s.diameterUnderWiresMm, s.wireDiameterMm), unit: 'mm', formula: 'dw = Du + δw', working: `dw = ${sig(s.diameterUnderWiresMm)} + ${sig(s.wireDiameterMm)}`, source: 'Geometry: wire centres lie one wire radius outside the diameter under them' });
  const area = add({ key: 'wiresAreaMm2', label: 'Screen wires cross-section', value: wiresAreaMm2(s.wireCount, s.wireDiameterMm), unit: 'mm²', formula: 'Aw = n·π·δw²/4', working: `Aw = ${s.wireCount}·π·${sig(s.wireDiameterMm)}²/4`, source: 'Geometry of n round wires (exact)' });
  const lay = s.layLengthMm === undefined ? 1 : add({ key: 'wiresLayFactor', label: 'Wire length per unit cable length', value: layLengthFactor(dWires, s.layLengthMm), unit: '', formula: 'kl = √(1 + (π·dw/L)²)', working: `kl = √(1 + (π·${sig(dWires)}/${sig(s.layLengthMm)})²)`, source: 'Geometry of a helix of lay length L (exact)' });
  const rw20 = add({ key: 'wiresR20', label: `Screen wires resistance at 20 °C (${metal.label})`, value: resistanceOhmPerKm(metal.resistivity20OhmM, area) * lay, unit: 'Ω/km', formula: 'Rw20 = ρ20·kl / Aw', working: `Rw20 = ${metal.resistivity20OhmM.toExponential(4)} Ω·m·${sig(lay)} / ${sig(area)} mm²`, source: TABLE_1_SOURCE });
  const rw = hot(s.foil ? 'wiresR' : 'sheathResistanceOhmPerKm', 'Screen wires resistance', rw20, metal.alpha20PerK);
  if (!s.foil) {
    add({ key: 'sheathMeanDiameterMm', label: 'Screen mean diameter', value: dWires, unit: 'mm', formula: 'd = dw', working: `d = ${sig(dWires)}`, source: 'The wire layer is the only metallic layer' });
    return { meanDiameterMm: dWires, resistanceOhmPerKm: rw };
  }

  const foilMetal = SHEATH_METALS[s.foil.material];
  const dFoil = add({ key: 'foilMeanDiameterMm', label: 'Mean diameter of the foil', value: s.diameterUnderWiresMm + 2 * s.wireDiameterMm + s.foil.thicknessMm, unit: 'mm', formula: 'df = Du + 2·δw + tf', working: `df = ${sig(s.diameterUnderWiresMm)} + 2·${sig(s.wireDiameterMm)} + ${sig(s.foil.thicknessMm)}`, source: 'Geometry: the foil lies over the wires' });
  const foilArea = add({ key: 'foilAreaMm2', label: 'Foil cross-section', value: tubeAreaMm2(dFoil, s.foil.thicknessMm), unit: 'mm²', formula: 'Af = π·df·tf', working: `Af = π·${sig(dFoil)}·${sig(s.foil.thicknessMm)}`, source: 'Geometry of a closed tube (an overlapped foil counted once)' });
  const rf20 = add({ key: 'foilR20', label: `Foil resistance at 20 °C (${foilMetal.label})`, value: resistanceOhmPerKm(foilMetal.resistivity20OhmM, foilArea), unit: 'Ω/km', formula: 'Rf20 = ρ20 / Af', working: `Rf20 = ${foilMetal.resistivity20OhmM.toExponential(4)} Ω·m / ${sig(foilArea)} mm²`, source: TABLE_1_SOURCE });
  const rf = hot('foilR', 'Foil resistance', rf20, foilMetal.alpha20PerK);
  const both = parallelLayers([{ resistanceOhmPerKm: rw, meanDiameterMm: dWires }, { resistanceOhmPerKm: rf, meanDiameterMm: dFoil }]);
  add({ key: 'sheathResistanceOhmPerKm', label: `Screen resistance at ${s.operatingTemperatureC} °C (wires ∥ foil)`, value: both.resistanceOhmPerKm, unit: 'Ω/km', formula: 'Rs = Rw·Rf / (Rw + Rf)', working: `Rs = ${sig(rw)}·${sig(rf)} / (${sig(rw)} + ${sig(rf)})`, source: 'Layers in parallel' });
  add({ key: 'sheathMeanDiameterMm', label: 'Screen mean diameter (wires and foil as one)', value: both.meanDiameterMm, unit: 'mm', formula: 'ln d = sw·ln dw + sf·ln df, s = share of the current (∝ 1/R)', working: `sw = ${sig(both.shares[0])}, sf = ${sig(both.shares[1])}`, source: 'Our derivation: the flux linkage with the core of two concentric layers sharing current by conductance' });
  return { meanDiameterMm: both.meanDiameterMm, resistanceOhmPerKm: both.resistanceOhmPerKm };
}
