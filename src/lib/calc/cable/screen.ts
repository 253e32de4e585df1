/**
 * Geometry of metallic sheaths and wire screens. Areas are exact for the idealised shapes;
 * the resistance and its temperature rise come from materials.ts.
 */

/** A tube of mean diameter d and wall t has the area π·d·t exactly: (π/4)·[(d+t)² − (d−t)²]. */
export const tubeAreaMm2 = (meanDiameterMm: number, thicknessMm: number): number => Math.PI * meanDiameterMm * thicknessMm;

/** n round wires of diameter d_w: n·π·d_w²/4. */
export const wiresAreaMm2 = (wireCount: number, wireDiameterMm: number): number => (wireCount * Math.PI * wireDiameterMm ** 2) / 4;

/** The wires' layer sits on the diameter under them; its mean diameter is that plus one wire diameter. */
export const wireLayerMeanDiameterMm = (diameterUnderWiresMm: number, wireDiameterMm: number): number => diameterUnderWiresMm + wireDiameterMm;

/**
 * Length of a helically laid wire per unit length of cable: √(1 + (π·D/L)²) for a helix of
 * mean diameter D and lay length L (geometry of the helix).
 */
export const layLengthFactor = (meanDiameterMm: number, layLengthMm: number): number => Math.sqrt(1 + ((Math.PI * meanDiameterMm) / layLengthMm) ** 2);

/**
 * Two concentric layers in parallel share current in proportion to their conductance (their
 * resistances are far larger than the reactance between two close layers), so the pair acts
 * as one tube whose diameter is the share-weighted geometric mean: this keeps the flux linkage
 * with the core inside exact (ln d = Σ share·ln dᵢ). Our derivation.
 */
export function parallelLayers(layers: Array<{ resistanceOhmPerKm: number; meanDiameterMm: number }>): { resistanceOhmPerKm: number; meanDiameterMm: number; shares: number[] } {
  const conductance = layers.map((l) => 1 / l.resistanceOhmPerKm);
  const total = conductance.reduce((a, b) => a + b, 0);
  const shares = conductance.map((g) => g / total);
  const lnD = layers.reduce((s, l, i) => s + shares[i] * Math.log(l.meanDiameterMm), 0);
  return { resistanceOhmPerKm: 1 / total, meanDiameterMm: Math.exp(lnD), shares };
}
