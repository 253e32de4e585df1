import type { BondingStudy, Layout } from '../../schemas/bonding-study.schema';

// The route as the solver sees it: segments (a section, or part of one where a mid-point
// earthing or an ECC transposition falls inside it) and the joints between them, each joint
// saying how the sheaths meet there and which ends are earthed.

/** How the sheaths of the segments either side of a joint meet. */
export type SheathJoin =
  | 'straight' // continuous: each sheath carries on along its own cable
  | 'cross' // cross-bonding link box: each sheath carries on along the next cable
  | 'break'; // sectionalised: each side ends here, earthed or open

export interface RouteJoint {
  index: number;
  chainageM: number;
  /** Joint number as the user counts them (0 = route start), or undefined for an internal split point. */
  userJointIndex?: number;
  join: SheathJoin;
  /** Sheaths arriving from the left are bonded to earth here (for 'straight', the sheaths passing through). */
  earthLeft: boolean;
  earthRight: boolean;
  hasLeft: boolean;
  hasRight: boolean;
}

export interface RouteSegment {
  index: number;
  sectionIndex: number;
  sectionId: string;
  startM: number;
  lengthM: number;
  layout: Layout;
  phaseRotation: 0 | 1 | 2;
  /** ECCs present along this segment, and which of them sit in their mirrored position. */
  eccIds: string[];
  mirroredEccIds: Set<string>;
}

export interface RouteTopology {
  segments: RouteSegment[];
  joints: RouteJoint[];
  /** For each ECC, the joints at the ends of its run. */
  eccSpans: Map<string, { fromJoint: number; toJoint: number }>;
  lengthM: number;
}

const SAME_POINT_M = 1e-6;

/** Builds the topology of a study whose references have already been checked. */
export function buildRouteTopology(study: BondingStudy): RouteTopology {
  const sectionStart: number[] = [];
  let total = 0;
  for (const s of study.sections) {
    sectionStart.push(total);
    total += s.lengthM;
  }
  const sectionIndex = new Map(study.sections.map((s, i) => [s.id, i]));

  // Where sheaths are earthed or cut, keyed by user joint; and extra split chainages.
  const userJoints = study.sections.length + 1;
  const join: SheathJoin[] = Array.from({ length: userJoints }, () => 'straight');
  const earthLeft = Array<boolean>(userJoints).fill(false);
  const earthRight = Array<boolean>(userJoints).fill(false);
  const midEarths: number[] = [];

  for (const group of study.bonding) {
    const first = sectionIndex.get(group.sectionIds[0])!;
    const last = sectionIndex.get(group.sectionIds[group.sectionIds.length - 1])!;
    const startJ = first;
    const endJ = last + 1;
    join[startJ] = 'break';
    join[endJ] = 'break';
    const earthStart = group.kind !== 'single-point' || group.earthedAt === 'start';
    const earthEnd = group.kind !== 'single-point' || group.earthedAt === 'end';
    earthRight[startJ] = earthStart;
    earthLeft[endJ] = earthEnd;
    if (group.kind === 'cross-bonded') {
      for (let j = startJ + 1; j < endJ; j++) join[j] = 'cross';
    }
    if (group.kind === 'single-point' && group.earthedAt === 'middle') {
      midEarths.push((sectionStart[first] + sectionStart[last] + study.sections[last].lengthM) / 2);
    }
  }

  // Chainages where each ECC crosses to the mirror position: the middle of its run (which may
  // fall inside a section), or the joints named; past an odd number of them it is mirrored.
  const jointChainage = (j: number) => (j === 0 ? 0 : sectionStart[j - 1] + study.sections[j - 1].lengthM);
  const eccCrossings = new Map<string, number[]>();
  for (const ecc of study.eccs) {
    const a = sectionIndex.get(ecc.fromSectionId)!;
    const b = sectionIndex.get(ecc.toSectionId)!;
    if (ecc.transposedAtMidpoint) eccCrossings.set(ecc.id, [(sectionStart[a] + sectionStart[b] + study.sections[b].lengthM) / 2]);
    else if (ecc.transposedAtJoints?.length) eccCrossings.set(ecc.id, ecc.transposedAtJoints.map(jointChainage).sort((p, q) => p - q));
  }
  const mirroredAt = (id: string, x: number) => (eccCrossings.get(id) ?? []).filter((c) => c < x).length % 2 === 1;

  // Chainages of all joints: user joints plus split points that fall inside a section.
  const points = new Map<number, { user?: number; midEarth: boolean }>();
  for (let j = 0; j < userJoints; j++) points.set(jointChainage(j), { user: j, midEarth: false });
  const addPoint = (x: number, midEarth: boolean) => {
    for (const [c, p] of points) {
      if (Math.abs(c - x) < SAME_POINT_M) {
        p.midEarth ||= midEarth;
        return;
      }
    }
    points.set(x, { midEarth });
  };
  midEarths.forEach((x) => addPoint(x, true));
  eccCrossings.forEach((xs) => xs.forEach((x) => addPoint(x, false)));
  // An internal fault at a chainage needs a node there; a straight split changes nothing else.
  for (const c of study.cases) {
    if (c.kind === 'internal-fault' && c.internalFault?.chainageM !== undefined) addPoint(c.internalFault.chainageM, false);
  }

  const chainages = [...points.keys()].sort((p, q) => p - q);
  const joints: RouteJoint[] = chainages.map((c, index) => {
    const p = points.get(c)!;
    const u = p.user;
    const base = u === undefined ? { join: 'straight' as SheathJoin, earthLeft: false, earthRight: false } : { join: join[u], earthLeft: earthLeft[u], earthRight: earthRight[u] };
    if (p.midEarth) Object.assign(base, { earthLeft: true, earthRight: true });
    return { index, chainageM: c, userJointIndex: u, ...base, hasLeft: index > 0, hasRight: index < chainages.length - 1 };
  });

  const segments: RouteSegment[] = [];
  for (let k = 0; k + 1 < joints.length; k++) {
    const startM = joints[k].chainageM;
    const mid = startM + (joints[k + 1].chainageM - startM) / 2;
    const si = study.sections.findIndex((s, i) => mid >= sectionStart[i] && mid < sectionStart[i] + s.lengthM);
    const section = study.sections[si];
    const layout = study.layouts.find((l) => l.id === section.layoutId)!;
    const eccIds = study.eccs
      .filter((e) => si >= sectionIndex.get(e.fromSectionId)! && si <= sectionIndex.get(e.toSectionId)!)
      .map((e) => e.id);
    const mirroredEccIds = new Set(eccIds.filter((e) => mirroredAt(e, mid)));
    segments.push({
      index: k,
      sectionIndex: si,
      sectionId: section.id,
      startM,
      lengthM: joints[k + 1].chainageM - startM,
      layout,
      // A transposition acts at the section's start and holds along the whole section.
      phaseRotation: section.phaseRotation,
      eccIds,
      mirroredEccIds,
    });
  }

  const eccSpans = new Map<string, { fromJoint: number; toJoint: number }>();
  for (const ecc of study.eccs) {
    const on = segments.filter((s) => s.eccIds.includes(ecc.id));
    eccSpans.set(ecc.id, { fromJoint: on[0].index, toJoint: on[on.length - 1].index + 1 });
  }
  return { segments, joints, eccSpans, lengthM: total };
}

/** The joint nearest a chainage (internal-fault split points are added at exactly their chainage). */
export function jointAtChainage(topology: RouteTopology, chainageM: number): RouteJoint {
  return topology.joints.reduce((best, j) => (Math.abs(j.chainageM - chainageM) < Math.abs(best.chainageM - chainageM) ? j : best));
}

/** Whether a joint has an open sheath end or a cross-bonding link box, where an SVL can sit. */
export function svlPlacement(joint: RouteJoint): { toEarth: boolean; acrossJoint: boolean } {
  if (joint.join === 'cross') return { toEarth: true, acrossJoint: true };
  if (joint.join === 'straight') return { toEarth: false, acrossJoint: false };
  const openLeft = joint.hasLeft && !joint.earthLeft;
  const openRight = joint.hasRight && !joint.earthRight;
  return { toEarth: openLeft || openRight, acrossJoint: joint.hasLeft && joint.hasRight && (openLeft || openRight) };
}
