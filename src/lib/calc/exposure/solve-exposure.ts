import type { ExposureStudy } from '../../schemas/exposure-study.schema';
import { type Complex, ZERO, abs, add, mul, polar, scale } from '../complex';
import { ENGINE_VERSION } from '../constants';
import { mutualImpedanceOhmPerM, selfImpedanceOhmPerM } from '../earth-return';
import { EARTH, NetworkBuilder, crossSectionCoupling } from '../network';
import { acCurrentDensityAPerM2 } from '../pipeline';
import { tolerableVoltages } from '../body-tolerance';

export interface ExposureCaseResult {
  caseId: string;
  name: string;
  kind: 'normal' | 'fault';
  durationS?: number;
  /** Longitudinal EMF along the whole parallel length, after screening, V: end to end with both ends open. */
  emfV: number;
  /** The metalwork's start and end to remote earth, V. */
  startV: number;
  endV: number;
  currentA: number;
  /**
   * The larger of the two end voltages to remote earth: what a person standing on undisturbed
   * ground can touch. Conservative where the ground near the end is raised by the object's own electrode.
   */
  accessibleV: number;
  accessibleAt: 'start' | 'end';
  /** What every voltage here except the EMF is measured against. */
  reference: 'remote earth';
  tolerable?: { touchV: number; stepV: number; bodyCurrentA: number; surfaceFactor: number };
  /** Pipelines, normal cases: a.c. current density at the assumed coating defect, A/m². */
  acCurrentDensityAPerM2?: number;
}

export interface ExposureResults {
  kind: 'exposure';
  engineVersion: string;
  cases: ExposureCaseResult[];
}

/** Solves the metalwork as one coupled conductor with earth return, for every case. */
export function calculateExposureStudy(study: ExposureStudy): ExposureResults {
  const { object: o, frequencyHz: f, soilResistivityOhmM: rho } = study;
  const zSelf = selfImpedanceOhmPerM(o.resistanceOhmPerKm / 1000, o.gmrMm / 1000, f, rho);
  const zMutual = study.sources.map((s) => scale(mutualImpedanceOhmPerM(Math.hypot(s.xM - o.xM, s.yM - o.yM), f, rho), o.screeningFactor));

  const builder = new NetworkBuilder();
  const start = builder.addNode(0, `${o.name}, start`);
  const end = builder.addNode(1, `${o.name}, end`);
  builder.addSegment([start], [end], o.parallelLengthM, crossSectionCoupling([[zSelf]], [zMutual], study.sources.map((_, i) => i)));
  if (o.earthing !== 'end') builder.addAdmittance(start, EARTH, { re: 1 / o.earthStartOhm, im: 0 });
  if (o.earthing !== 'start') builder.addAdmittance(end, EARTH, { re: 1 / o.earthEndOhm, im: 0 });
  const network = builder.compile();

  const cases = study.cases.map((c): ExposureCaseResult => {
    const sources: Complex[] = study.sources.map((s) => {
      const cur = c.currents.find((x) => x.sourceId === s.id);
      return cur ? polar(cur.currentA, cur.angleDeg) : ZERO;
    });
    const solution = network.solve(sources);
    const emf = zMutual.reduce((sum, z, i) => add(sum, mul(z, sources[i])), ZERO);
    const startV = abs(solution.voltage(start));
    const endV = abs(solution.voltage(end));
    const accessibleV = Math.max(startV, endV);
    const tolerable =
      c.kind === 'fault' && c.durationS !== undefined
        ? tolerableVoltages({ soilResistivityOhmM: rho, surfaceLayer: study.touch.surfaceLayer, durationS: c.durationS, bodyWeightKg: study.touch.bodyWeightKg })
        : undefined;
    return {
      caseId: c.id,
      name: c.name,
      kind: c.kind,
      durationS: c.durationS,
      emfV: abs(emf) * o.parallelLengthM,
      startV,
      endV,
      currentA: abs(solution.segmentCurrents(0)[0]),
      accessibleV,
      accessibleAt: startV >= endV ? 'start' : 'end',
      reference: 'remote earth',
      tolerable: tolerable && { touchV: tolerable.touchV, stepV: tolerable.stepV, bodyCurrentA: tolerable.bodyCurrentA, surfaceFactor: tolerable.surfaceFactor },
      acCurrentDensityAPerM2:
        o.type === 'pipeline' && c.kind === 'normal' && o.coatingDefectDiameterMm
          ? acCurrentDensityAPerM2(accessibleV, rho, o.coatingDefectDiameterMm / 1000)
          : undefined,
    };
  });
  return { kind: 'exposure', engineVersion: ENGINE_VERSION, cases };
}
