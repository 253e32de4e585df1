import type { BondingStudy, CableType } from '../../schemas/bonding-study.schema';
import { impedanceMatrix, type LongitudinalConductor } from '../earth-return';
import type { Complex } from '../complex';
import { type CrossSectionCoupling, crossSectionCoupling } from '../network';
import { cablePositions, positionOfPhase } from './cross-section';
import type { RouteSegment } from './route-topology';

/**
 * Conductor order in every segment: the sheaths (circuit by circuit, phases a, b, c), then the
 * ECCs present; sources are the phase cores in the same circuit/phase order.
 */
export function segmentCoupling(study: BondingStudy, segment: RouteSegment): CrossSectionCoupling {
  const { z, metallicCount } = crossSectionImpedance(study, segment);
  const zmm = z.slice(0, metallicCount).map((row) => row.slice(0, metallicCount));
  const zms = z.slice(0, metallicCount).map((row) => row.slice(metallicCount));
  return crossSectionCoupling(zmm, zms, z.slice(metallicCount).map((_, i) => i));
}

/**
 * The per-metre impedance matrix of a cross-section with earth return, Ω/m: sheaths (circuit
 * by circuit, phases a, b, c), ECCs, then the phase cores in the same order.
 */
export function crossSectionImpedance(study: BondingStudy, segment: RouteSegment): { z: Complex[][]; metallicCount: number; labels: string[] } {
  const cableType = (circuitId: string): CableType =>
    study.cableTypes.find((t) => t.id === study.circuits.find((c) => c.id === circuitId)!.cableTypeId)!;

  const sheaths: LongitudinalConductor[] = [];
  const cores: LongitudinalConductor[] = [];
  for (const circuit of study.circuits) {
    const placement = segment.layout.circuits.find((p) => p.circuitId === circuit.id)!;
    const positions = cablePositions(placement);
    const type = cableType(circuit.id);
    for (let phase = 0; phase < 3; phase++) {
      const at = positions[positionOfPhase(phase, segment.phaseRotation)];
      sheaths.push({ xM: at.xM, yM: at.depthM, resistanceOhmPerM: type.sheathResistanceOhmPerKm / 1000, gmrM: type.sheathMeanDiameterMm / 2000 });
      cores.push({ xM: at.xM, yM: at.depthM, resistanceOhmPerM: type.conductorResistanceOhmPerKm / 1000, gmrM: type.conductorGmrMm / 1000 });
    }
  }
  const centreX = sheaths.reduce((s, c) => s + c.xM, 0) / sheaths.length;
  const eccs: LongitudinalConductor[] = segment.eccIds.map((id) => {
    const ecc = study.eccs.find((e) => e.id === id)!;
    const at = segment.layout.eccs.find((p) => p.eccId === id)!;
    const xM = segment.mirroredEccIds.has(id) ? 2 * centreX - at.xM : at.xM;
    return { xM, yM: at.depthM, resistanceOhmPerM: ecc.resistanceOhmPerKm / 1000, gmrM: ecc.gmrMm / 1000 };
  });

  const metallic = [...sheaths, ...eccs];
  const all = [...metallic, ...cores];
  const nm = metallic.length;
  // A core and its own sheath share an axis: their mutual uses the sheath's mean radius.
  const z = impedanceMatrix(all, study.frequencyHz, study.soilResistivityOhmM, (i, j) => {
    const [m, c] = i < j ? [i, j] : [j, i];
    return m < sheaths.length && c - nm === m ? sheaths[m].gmrM : undefined;
  });
  const cableLabels = study.circuits.flatMap((c) => ['a', 'b', 'c'].map((p) => `${c.id}-${p}`));
  const labels = [...cableLabels.map((l) => `sheath ${l}`), ...segment.eccIds.map((id) => `ECC ${id}`), ...cableLabels.map((l) => `core ${l}`)];
  return { z, metallicCount: nm, labels };
}

/** A stable key for segments that share a cross-section, so their coupling is computed once. */
export const crossSectionKey = (segment: RouteSegment): string =>
  `${segment.layout.id}|${segment.phaseRotation}|${segment.eccIds.join(',')}|${[...segment.mirroredEccIds].sort().join(',')}`;
