import type { BondingStudy } from '../../schemas/bonding-study.schema';
import { type Complex, div } from '../complex';
import { EARTH, NetworkBuilder } from '../network';
import { bondingLeadImpedance } from './bonding-lead';
import { crossSectionKey, segmentCoupling } from './impedances';
import { type RouteJoint, type RouteTopology, buildRouteTopology, jointAtChainage } from './route-topology';
import type { CrossSectionCoupling } from '../network';

export const SVL_TAG = 'svl-conducting';
/** Present only while SVLs do not conduct: their leakage, which alone fixes the star point of a box with no electrode. */
export const SVL_OFF_TAG = 'svl-blocking';
/**
 * Leakage of a metal-oxide SVL below its continuous operating voltage, as a resistance: of the
 * order of a milliampere at a few kilovolts (from memory). Only the star point of a box with
 * no electrode depends on it, and there only through the ratio of equal leakages.
 */
export const SVL_BLOCKING_OHM = 1e6;

/** The local earth at a joint: a station grid, a link-box electrode, or a box with none. */
export type LocalEarthKind = 'station-grid' | 'link-box-electrode' | 'no-electrode';
const PHASES = 'abc';

export interface CableRef {
  circuitId: string;
  phase: 0 | 1 | 2;
  /** e.g. "C1-a": the sheath running along the cable of phase a of circuit C1. */
  label: string;
}

/** Where each quantity of interest lives in the network. */
export interface BondingNetworkModel {
  topology: RouteTopology;
  builder: NetworkBuilder;
  cables: CableRef[];
  eccIds: string[];
  /** Per joint: the sheath end nodes on each side (by cable index), the ECC nodes, the earth bar. */
  jointNodes: Array<{
    left: number[];
    right: number[];
    ecc: Map<string, number>;
    /** The local earth node (station earth bar or link-box earth terminal), joined to remote earth by `earthOhm`. */
    earthBar?: number;
    /** Electrode resistance; undefined for a box with no electrode. */
    earthOhm?: number;
    earthKind?: LocalEarthKind;
  }>;
  /** Per segment: network segment index, and its conductor order (cables, then ECC ids). */
  segments: Array<{ networkIndex: number; eccIds: string[] }>;
  /** SVL elements added: study SVL index, joint, cable, the nodes across it (b is the box's earth node for an SVL to earth). */
  svls: Array<{ svlIndex: number; joint: number; cable: number; a: number; b: number; admittanceS: Complex }>;
  /** Length of a case's source vector. */
  sourceCount: number;
  /** Source-vector entries: current entering the earth at the end and at the start station grids. */
  earthAtEndIndex: number;
  earthAtStartIndex: number;
  /** Per internal-fault case: the joint of the breakdown, the sheath node it feeds, its source entry. */
  internalFaults: Map<string, { joint: number; node: number; cable: number; sourceIndex: number }>;
  /** Station grid resistances as used (overrides included). */
  routeStartOhm: number;
  routeEndOhm: number;
  routeStartBar: number;
  routeEndBar: number;
}

/** Builds the coupled network of a checked bonding study. */
export function buildBondingNetwork(study: BondingStudy): BondingNetworkModel {
  const topology = buildRouteTopology(study);
  const builder = new NetworkBuilder();
  const cables: CableRef[] = study.circuits.flatMap((c) =>
    [0, 1, 2].map((p) => ({ circuitId: c.id, phase: p as 0 | 1 | 2, label: `${c.id}-${PHASES[p]}` })),
  );
  const last = topology.joints.length - 1;

  const jointNodes: BondingNetworkModel['jointNodes'] = topology.joints.map((joint) => {
    const tag = `joint ${joint.userJointIndex ?? `(internal, ${joint.chainageM.toFixed(1)} m)`}`;
    const left = joint.hasLeft ? cables.map((c) => builder.addNode(joint.index, `sheath ${c.label} arriving at ${tag}`)) : [];
    const right = joint.hasRight ? cables.map((c) => builder.addNode(joint.index, `sheath ${c.label} leaving ${tag}`)) : [];
    const ecc = new Map<string, number>();
    for (const [id, span] of topology.eccSpans) {
      if (joint.index >= span.fromJoint && joint.index <= span.toJoint) ecc.set(id, builder.addNode(joint.index, `ECC ${id} at ${tag}`));
    }
    return { left, right, ecc };
  });

  const leadZ: Complex = bondingLeadImpedance(study).ohm;
  const leadIdeal = leadZ.re === 0 && leadZ.im === 0;

  const toEarthSvlJoints = new Set(study.svls.filter((v) => v.connection === 'to-earth').map((v) => v.jointIndex));
  topology.joints.forEach((joint, j) => {
    const nodes = jointNodes[j];
    const electrode = localElectrode(study, topology, joint, j === 0, j === last);
    if (electrode && (electrode.ohm !== undefined || toEarthSvlJoints.has(joint.userJointIndex ?? -1))) {
      const what = electrode.kind === 'station-grid' ? 'station earth' : electrode.kind === 'no-electrode' ? 'link-box star point (no electrode)' : 'link-box earth';
      nodes.earthBar = builder.addNode(j, `${what} at joint ${joint.userJointIndex ?? `(internal, ${joint.chainageM.toFixed(1)} m)`}`);
      nodes.earthOhm = electrode.ohm;
      nodes.earthKind = electrode.kind;
      if (electrode.ohm !== undefined) builder.addAdmittance(nodes.earthBar, EARTH, { re: 1 / electrode.ohm, im: 0 });
    }
    const bar = nodes.earthBar!;
    if (joint.join === 'straight') {
      nodes.left.forEach((n, c) => builder.connect(n, nodes.right[c]));
      if (joint.earthLeft) nodes.left.forEach((n) => builder.connect(n, bar));
    } else if (joint.join === 'cross') {
      nodes.left.forEach((n, c) => {
        const next = nodes.right[sameCircuitNextPhase(c)];
        if (leadIdeal) builder.connect(n, next);
        else builder.addAdmittance(n, next, div({ re: 1, im: 0 }, leadZ));
      });
    } else {
      if (joint.earthLeft) nodes.left.forEach((n) => builder.connect(n, bar));
      if (joint.earthRight) nodes.right.forEach((n) => builder.connect(n, bar));
    }
    for (const [id, span] of topology.eccSpans) {
      if (span.fromJoint === j || span.toJoint === j) builder.connect(nodes.ecc.get(id)!, bar);
    }
  });

  const couplings = new Map<string, CrossSectionCoupling>();
  const segments = topology.segments.map((seg) => {
    const key = crossSectionKey(seg);
    if (!couplings.has(key)) couplings.set(key, segmentCoupling(study, seg));
    const from = [...jointNodes[seg.index].right, ...seg.eccIds.map((id) => jointNodes[seg.index].ecc.get(id)!)];
    const to = [...jointNodes[seg.index + 1].left, ...seg.eccIds.map((id) => jointNodes[seg.index + 1].ecc.get(id)!)];
    return { networkIndex: builder.addSegment(from, to, seg.lengthM, couplings.get(key)!), eccIds: seg.eccIds };
  });

  // SVLs as installed: to earth, each sheath terminal to the box's earth node (the star point,
  // which the box electrode or station grid joins to remote earth); across the joint, between
  // the two sheath ends.
  const svls: BondingNetworkModel['svls'] = [];
  study.svls.forEach((svl, svlIndex) => {
    const j = topology.joints.findIndex((x) => x.userJointIndex === svl.jointIndex);
    const joint = topology.joints[j];
    const nodes = jointNodes[j];
    const y = { re: 1 / svl.conductingResistanceOhm, im: 0 };
    const box = nodes.earthBar!;
    cables.forEach((_, c) => {
      const pairs: Array<[number, number]> = [];
      if (svl.connection === 'across-joint') pairs.push([nodes.left[c], nodes.right[c]]);
      else if (joint.join === 'cross') pairs.push([nodes.left[c], box]);
      else {
        if (joint.hasLeft && !joint.earthLeft) pairs.push([nodes.left[c], box]);
        if (joint.hasRight && !joint.earthRight) pairs.push([nodes.right[c], box]);
      }
      for (const [a, b] of pairs) {
        builder.addAdmittance(a, b, y, SVL_TAG);
        if (nodes.earthOhm === undefined && b === box) builder.addAdmittance(a, b, { re: 1 / SVL_BLOCKING_OHM, im: 0 }, SVL_OFF_TAG);
        svls.push({ svlIndex, joint: j, cable: c, a, b, admittanceS: y });
      }
    });
  });

  // Currents entering the earth at the station grids (a through fault's residual, its return
  // to the source neutral, a station rise from elsewhere): their phasors carry the sign.
  const earthAtEndIndex = cables.length;
  const earthAtStartIndex = cables.length + 1;
  builder.addInjection(jointNodes[last].earthBar!, earthAtEndIndex, 1);
  builder.addInjection(jointNodes[0].earthBar!, earthAtStartIndex, 1);
  // Each internal fault puts its current into the faulted sheath at its own point.
  const internalFaults: BondingNetworkModel['internalFaults'] = new Map();
  let sourceCount = cables.length + 2;
  for (const c of study.cases) {
    if (c.kind !== 'internal-fault' || !c.internalFault) continue;
    const f = c.internalFault;
    const joint = f.chainageM !== undefined ? jointAtChainage(topology, f.chainageM) : topology.joints.find((x) => x.userJointIndex === f.jointIndex)!;
    const cable = cables.findIndex((x) => x.circuitId === f.circuitId && x.phase === 'abc'.indexOf(f.phase));
    const nodes = jointNodes[joint.index];
    const node = (f.side === 'leaving' && joint.hasRight) || !joint.hasLeft ? nodes.right[cable] : nodes.left[cable];
    const sourceIndex = sourceCount++;
    builder.addInjection(node, sourceIndex, 1);
    internalFaults.set(c.id, { joint: joint.index, node, cable, sourceIndex });
  }

  function sameCircuitNextPhase(c: number): number {
    return c - (c % 3) + ((c % 3) + 1) % 3;
  }

  return {
    topology,
    builder,
    cables,
    eccIds: study.eccs.map((e) => e.id),
    jointNodes,
    segments,
    svls,
    sourceCount,
    earthAtEndIndex,
    earthAtStartIndex,
    internalFaults,
    routeStartOhm: jointNodes[0].earthOhm!,
    routeEndOhm: jointNodes[last].earthOhm!,
    routeStartBar: jointNodes[0].earthBar!,
    routeEndBar: jointNodes[last].earthBar!,
  };
}

/** Whether a joint has a local earth: a route end, any link box, a mid-point earthing, an ECC end. */
export function hasLocalEarth(topology: RouteTopology, joint: RouteJoint, isEnd: boolean): boolean {
  return (
    isEnd || joint.join !== 'straight' || joint.earthLeft || joint.earthRight ||
    [...topology.eccSpans.values()].some((s) => s.fromJoint === joint.index || s.toJoint === joint.index)
  );
}

/** The electrode at a joint, or undefined where the joint has no link box (a straight-through joint). */
function localElectrode(study: BondingStudy, topology: RouteTopology, joint: RouteJoint, isStart: boolean, isEnd: boolean): { kind: LocalEarthKind; ohm?: number } | undefined {
  if (!hasLocalEarth(topology, joint, isStart || isEnd)) return undefined;
  const kind: LocalEarthKind = isStart || isEnd ? 'station-grid' : 'link-box-electrode';
  const override = study.earthing.overrides.find((o) => o.jointIndex === joint.userJointIndex);
  if (override?.noElectrode) return { kind: 'no-electrode' };
  if (override?.resistanceOhm !== undefined) return { kind, ohm: override.resistanceOhm };
  if (isStart) return { kind, ohm: study.earthing.routeStartOhm };
  if (isEnd) return { kind, ohm: study.earthing.routeEndOhm };
  return { kind, ohm: study.earthing.linkBoxOhm };
}
