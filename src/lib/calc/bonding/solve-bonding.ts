import type { BondingStudy, StudyCase } from '../../schemas/bonding-study.schema';
import { type Complex, abs, argDeg, mul, sub } from '../complex';
import { ENGINE_VERSION } from '../constants';
import { IllConditionedError } from '../banded-lu';
import { type CompiledNetwork, FloatingNodesError, type NetworkSolution, type SegmentSources } from '../network';
import { CalculationError } from '../errors';
import { caseSegmentSources, caseSources, circuitCurrentA } from './case-sources';
import { bondingCrossChecks } from './cross-checks';
import { type BondingNetworkModel, SVL_OFF_TAG, SVL_TAG, buildBondingNetwork } from './network-model';
import type { BondingResults, CaseHandCheck, CaseResult, LocalEarth, PointKind, PointResult, ProfileSeries, SvlResult } from './results';
import { worstValues } from './worst-values';
import { jointInWords } from './joint-names';
import { crossSectionImpedance, crossSectionKey } from './impedances';

const PROFILE_STEPS = 6;

/**
 * What a calculation returns: `full`, everything the screens and the record show; `checks`, the
 * figures the checklist is evaluated from and nothing else (no route profile, hand-check tables,
 * closed-form cross-checks, impedance matrices, per-segment sheath currents or worst-value
 * summary), for design explorations that repeat the calculation hundreds of times. Every figure
 * `checks` returns equals the `full` one to the bit.
 */
export type CalculationScope = 'full' | 'checks';

/** Solves every case of a checked bonding study on one coupled network. */
export function calculateBondingStudy(study: BondingStudy, scope: CalculationScope = 'full'): BondingResults {
  const full = scope === 'full';
  const model = buildBondingNetwork(study);
  const compiled = new Map<boolean, CompiledNetwork>();
  const networkFor = (conducting: boolean) => {
    if (!compiled.has(conducting)) compiled.set(conducting, compileOrExplain(model, conducting));
    return compiled.get(conducting)!;
  };
  // Each distinct cross-section's impedance matrix, once: the hand-check figures of every case use them.
  const crossSections = full ? distinctCrossSections(model).map((x) => ({ ...x, ...crossSectionImpedance(study, x.seg) })) : [];
  const plans = pointPlans(study, model);
  const cases = study.cases.map((c) => {
    const sources = caseSources(study, model, c);
    const solution = solveOrExplain(networkFor(c.svlsConducting && study.svls.length > 0), sources, caseSegmentSources(study, model, c, sources), c);
    const result = caseResult(study, model, plans, c, solution, c.svlsConducting && study.svls.length > 0, full);
    return { ...result, handCheck: full ? handCheck(model, crossSections, sources, result.sheathCurrents.map((s) => s.maxA)) : NO_HAND_CHECK };
  });
  return {
    kind: 'bonding',
    engineVersion: ENGINE_VERSION,
    routeLengthM: model.topology.lengthM,
    cases,
    worst: full ? worstValues(cases) : [],
    crossChecks: full ? bondingCrossChecks(study, model, cases) : [],
    impedanceMatrices: crossSections.map(({ seg, sectionIds, z, labels }) => ({
      crossSection: crossSectionName(seg),
      layoutId: seg.layout.id,
      phaseRotation: seg.phaseRotation,
      sectionIds: [...sectionIds],
      conductors: labels,
      impedanceOhmPerKm: z.map((row) => row.map((v): [number, number] => [v.re * 1000, v.im * 1000])),
    })),
  };
}

const NO_HAND_CHECK: CaseResult['handCheck'] = { referenceCurrentA: 0, emfVPerKmPerKA: [], sheathCurrentAPerKA: [] };

/** Names a cross-section for the hand-check tables: layout, transposition, ECC positions. */
const crossSectionName = (seg: BondingNetworkModel['topology']['segments'][number]) =>
  `layout ${seg.layout.id}${seg.phaseRotation ? `, cables shifted ${seg.phaseRotation}` : ''}${seg.eccIds.length ? `, ECC ${seg.eccIds.map((e) => (seg.mirroredEccIds.has(e) ? `${e} mirrored` : e)).join(', ')}` : ''}`;

function distinctCrossSections(model: BondingNetworkModel) {
  const byKey = new Map<string, { seg: BondingNetworkModel['topology']['segments'][number]; sectionIds: Set<string> }>();
  for (const seg of model.topology.segments) {
    const key = crossSectionKey(seg);
    if (!byKey.has(key)) byKey.set(key, { seg, sectionIds: new Set() });
    byKey.get(key)!.sectionIds.add(seg.sectionId);
  }
  return [...byKey.values()];
}

type CrossSectionData = ReturnType<typeof distinctCrossSections>[number] & ReturnType<typeof crossSectionImpedance>;

function handCheck(model: BondingNetworkModel, crossSections: CrossSectionData[], sources: Complex[], sheathMaxA: number[]): CaseHandCheck {
  const cores = sources.slice(0, model.cables.length);
  const referenceCurrentA = Math.max(0, ...cores.map(abs));
  if (referenceCurrentA === 0) return { referenceCurrentA, emfVPerKmPerKA: [], sheathCurrentAPerKA: [] };
  const perKA = 1000 / referenceCurrentA;
  const emfVPerKmPerKA = crossSections.flatMap(({ seg, z, metallicCount }) => {
    return model.cables.map((cable, i) => {
      let e: Complex = { re: 0, im: 0 };
      cores.forEach((current, j) => (e = { re: e.re + z[i][metallicCount + j].re * current.re - z[i][metallicCount + j].im * current.im, im: e.im + z[i][metallicCount + j].re * current.im + z[i][metallicCount + j].im * current.re }));
      return { crossSection: crossSectionName(seg), cable: cable.label, value: abs(e) * 1000 * perKA };
    });
  });
  return { referenceCurrentA, emfVPerKmPerKA, sheathCurrentAPerKA: model.cables.map((cable, k) => ({ cable: cable.label, value: sheathMaxA[k] * perKA })) };
}

function compileOrExplain(model: BondingNetworkModel, conducting: boolean): CompiledNetwork {
  try {
    return model.builder.compile(new Set([conducting ? SVL_TAG : SVL_OFF_TAG]));
  } catch (err) {
    if (err instanceof FloatingNodesError) {
      throw new CalculationError(`The bonding leaves sheaths or ECCs with no path to earth: ${err.labels.slice(0, 3).join('; ')}. Earth each sheath at least once.`, ['bonding']);
    }
    if (err instanceof IllConditionedError) {
      throw new CalculationError('The network equations are ill-conditioned: check for extreme resistances (for example an earth resistance far below 1 mΩ or above 1 GΩ).', ['earthing']);
    }
    throw err;
  }
}

function solveOrExplain(network: CompiledNetwork, sources: ReturnType<typeof caseSources>, segmentSources: SegmentSources | undefined, c: StudyCase): NetworkSolution {
  try {
    return network.solve(sources, segmentSources);
  } catch (err) {
    if (err instanceof IllConditionedError) {
      throw new CalculationError(`Case "${c.id}" gives no finite solution: check its currents for extreme values.`, ['cases']);
    }
    throw err;
  }
}

/** A reported point as the model fixes it, the same in every case: what it is, its label, which sheath ends and cut joints it shows. */
interface PointPlan {
  joint: BondingNetworkModel['topology']['joints'][number];
  nodes: BondingNetworkModel['jointNodes'][number];
  kind: PointKind;
  label: string;
  /** Sheath ends in display order (arriving then leaving), one per distinct node: ends bonded together show once. */
  ends: Array<{ node: number; cable: string; side: 'arriving' | 'leaving' }>;
  /** Cables whose sheath is cut at the joint: the two ends whose voltage difference stresses the insulation. */
  cuts: Array<{ cable: string; left: number; right: number }>;
}

/** The points of a model, planned once per calculation: every case reads the same nodes and labels. */
function pointPlans(study: BondingStudy, model: BondingNetworkModel): PointPlan[] {
  const { topology, builder, cables, jointNodes } = model;
  const last = topology.joints.length - 1;
  const plans: PointPlan[] = [];
  topology.joints.forEach((joint, j) => {
    const midEarth = joint.join === 'straight' && joint.earthLeft;
    if (joint.join === 'straight' && !midEarth) return;
    const nodes = jointNodes[j];
    const kind: PointKind =
      j === 0 || j === last ? 'route-end'
        : joint.join === 'cross' ? 'cross-bonding-link-box'
          : midEarth ? 'mid-point-earthing'
            : (joint.earthLeft && joint.earthRight) ? 'earthed-link-box' : 'open-end';
    const seen = new Set<number>();
    const ends: PointPlan['ends'] = [];
    (['arriving', 'leaving'] as const).forEach((side) => {
      (side === 'arriving' ? nodes.left : nodes.right).forEach((node, k) => {
        const rep = builder.find(node);
        if (seen.has(rep)) return;
        seen.add(rep);
        ends.push({ node, cable: cables[k].label, side });
      });
    });
    const cuts =
      joint.hasLeft && joint.hasRight && joint.join !== 'straight'
        ? cables.flatMap((cable, k) => (builder.find(nodes.left[k]) === builder.find(nodes.right[k]) ? [] : [{ cable: cable.label, left: nodes.left[k], right: nodes.right[k] }]))
        : [];
    // A named joint bay reads "joint bay JB-3 (joint 3) (960 m)"; unnamed joints read as before.
    const at = joint.userJointIndex === undefined ? `${joint.chainageM.toFixed(0)} m` : `${jointInWords(study, joint.userJointIndex)} (${joint.chainageM.toFixed(0)} m)`;
    plans.push({ joint, nodes, kind, label: `${at}, ${kind.replace(/-/g, ' ')}`, ends, cuts });
  });
  return plans;
}

function caseResult(study: BondingStudy, model: BondingNetworkModel, plans: PointPlan[], c: StudyCase, solution: NetworkSolution, conducting: boolean, full = true): Omit<CaseResult, 'handCheck'> {
  const { topology, cables } = model;

  const points: PointResult[] = plans.map(({ joint, nodes, kind, label, ends, cuts }) => {
    const earthV = nodes.earthBar === undefined ? undefined : solution.voltage(nodes.earthBar);
    const toLocal = (v: Complex) => (earthV === undefined ? null : sub(v, earthV));
    const sheathEnds: PointResult['sheathEnds'] = ends.map(({ node, cable, side }) => {
      const v = solution.voltage(node);
      const local = toLocal(v);
      return {
        cable,
        side,
        voltageV: abs(v),
        angleDeg: argDeg(v),
        toLocalEarthV: local && abs(local),
        toLocalEarthAngleDeg: local && argDeg(local),
      };
    });
    const acrossJoint = cuts.map(({ cable, left, right }) => ({ cable, voltageV: abs(sub(solution.voltage(left), solution.voltage(right))) }));
    const localEarth: LocalEarth | null =
      earthV === undefined
        ? null
        : {
            kind: nodes.earthKind!,
            resistanceOhm: nodes.earthOhm ?? null,
            voltageV: abs(earthV),
            angleDeg: argDeg(earthV),
            electrodeCurrentA: nodes.earthOhm === undefined ? 0 : abs(earthV) / nodes.earthOhm,
          };
    return {
      jointIndex: joint.userJointIndex ?? null,
      chainageM: joint.chainageM,
      kind,
      label,
      sheathEnds,
      acrossJoint,
      earthBarV: earthV === undefined ? undefined : abs(earthV),
      localEarth,
      eccV: [...nodes.ecc].map(([eccId, node]) => {
        const v = solution.voltage(node);
        const local = toLocal(v);
        return { eccId, voltageV: abs(v), toLocalEarthV: local && abs(local) };
      }),
      maxV: Math.max(0, ...sheathEnds.map((e) => e.voltageV)),
      maxToLocalEarthV: earthV === undefined ? null : Math.max(0, ...sheathEnds.map((e) => e.toLocalEarthV ?? 0)),
    };
  });

  const svls = model.svls.map((s): SvlResult => {
    const spec = study.svls[s.svlIndex];
    const across = sub(solution.voltage(s.a), solution.voltage(s.b));
    const current = conducting ? mul(across, s.admittanceS) : { re: 0, im: 0 };
    return {
      svlIndex: s.svlIndex,
      jointIndex: spec.jointIndex,
      cable: cables[s.cable].label,
      connection: spec.connection,
      terminals: spec.connection === 'across-joint' ? 'across the joint (sheath to sheath)' : `sheath to ${model.jointNodes[s.joint].earthKind === 'station-grid' ? 'station earth' : 'link-box earth'}`,
      voltageV: abs(across),
      angleDeg: argDeg(across),
      conducting,
      currentA: abs(current),
      currentAngleDeg: argDeg(current),
      continuousRatingV: spec.continuousRatingV,
      tovRatingV: spec.tovRatingV,
    };
  });

  const segmentCurrents = model.segments.map((s) => solution.segmentCurrents(s.networkIndex));
  // |I| per cable and segment, once: the per-segment table (full scope), the largest current and the loss factor read it.
  const sheathCurrentA = cables.map((_, k) => topology.segments.map((_seg, i) => abs(segmentCurrents[i][k])));
  const sheathCurrents = cables.map((cable, k) => {
    const currents = sheathCurrentA[k];
    let maxA = -Infinity;
    for (const a of currents) if (a > maxA) maxA = a;
    const perSegment = full ? topology.segments.map((seg, i) => ({ sectionId: seg.sectionId, startM: seg.startM, lengthM: seg.lengthM, currentA: currents[i] })) : [];
    return { cable: cable.label, maxA, perSegment };
  });
  const eccCurrents = model.eccIds.map((eccId) => ({
    eccId,
    maxA: Math.max(
      0,
      ...model.segments.flatMap((s, i) => (s.eccIds.includes(eccId) ? [abs(segmentCurrents[i][cables.length + s.eccIds.indexOf(eccId)])] : [])),
    ),
  }));

  const isLoad = c.kind === 'normal' || c.kind === 'emergency';
  const lossFactors = isLoad
    ? cables.flatMap((cable, k) => {
        const current = circuitCurrentA(c, cable.circuitId);
        if (current <= 0) return [];
        const type = study.cableTypes.find((t) => t.id === study.circuits.find((x) => x.id === cable.circuitId)!.cableTypeId)!;
        // Summed in segment order, as a reduce over the per-segment table would: the same figure to the bit in either scope.
        let sheathLoss = 0;
        topology.segments.forEach((seg, i) => (sheathLoss = sheathLoss + type.sheathResistanceOhmPerKm * seg.lengthM * sheathCurrentA[k][i] ** 2));
        return [{ cable: cable.label, lossFactor: sheathLoss / (type.conductorResistanceOhmPerKm * topology.lengthM * current ** 2) }];
      })
    : [];

  return {
    caseId: c.id,
    name: c.name,
    kind: c.kind,
    durationS: c.durationS,
    points,
    svls,
    sheathCurrents,
    eccCurrents,
    lossFactors,
    bondingLeadCurrents: topology.joints.flatMap((joint) =>
      joint.join === 'cross' && joint.userJointIndex !== undefined
        ? [{ jointIndex: joint.userJointIndex, maxA: Math.max(...cables.map((_, k) => abs(segmentCurrents[joint.index - 1][k]))) }]
        : [],
    ),
    profile: full ? routeProfile(model, solution) : { chainageM: [], series: [] },
  };
}

/** Sheath and ECC voltages sampled along every segment; exact, since each varies linearly along a segment. */
function routeProfile(model: BondingNetworkModel, solution: NetworkSolution): CaseResult['profile'] {
  const { topology, cables, jointNodes, eccIds } = model;
  const chainageM: number[] = [];
  const series: ProfileSeries[] = [
    ...cables.map((cable) => ({ label: `sheath ${cable.label}`, kind: 'sheath' as const, voltageV: [] as Array<number | null> })),
    ...eccIds.map((id) => ({ label: `ECC ${id}`, kind: 'ecc' as const, voltageV: [] as Array<number | null> })),
  ];
  for (const seg of topology.segments) {
    const from = jointNodes[seg.index];
    const to = jointNodes[seg.index + 1];
    const ends: Array<[Complex, Complex] | null> = [
      ...cables.map((_, k): [Complex, Complex] => [solution.voltage(from.right[k]), solution.voltage(to.left[k])]),
      ...eccIds.map((id): [Complex, Complex] | null => (seg.eccIds.includes(id) ? [solution.voltage(from.ecc.get(id)!), solution.voltage(to.ecc.get(id)!)] : null)),
    ];
    for (let step = 0; step <= PROFILE_STEPS; step++) {
      const t = step / PROFILE_STEPS;
      chainageM.push(seg.startM + t * seg.lengthM);
      ends.forEach((e, k) => series[k].voltageV.push(e && Math.hypot(e[0].re + t * (e[1].re - e[0].re), e[0].im + t * (e[1].im - e[0].im))));
    }
  }
  return { chainageM, series };
}
