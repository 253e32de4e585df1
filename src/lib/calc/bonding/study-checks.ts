import type { BondingStudy } from '../../schemas/bonding-study.schema';
import { cablePositions } from './cross-section';
import { buildRouteTopology, svlPlacement } from './route-topology';
import { hasLocalEarth } from './network-model';
import { earthReturnDepthM } from '../earth-return';

/**
 * Carson's simplified formulae hold while the earth-return depth De is much larger than the
 * spacing D. The first term they drop (Carson 1926, series for P and Q) is k/(3√2) with
 * k ≈ 1.85·D/De: at D/De = 0.1 it moves the reactance by about 4 %. Cable spacings are far
 * below this in any real soil, so a ratio under ten means a wrong resistivity or wrong units.
 */
export const MIN_DEPTH_TO_SPACING = 10;
/** Mirrors STUDY_LIMITS.conductors and maxRouteLengthM of the schema (the core cannot import zod modules). */
const MAX_CONDUCTORS = 40;
const MAX_ROUTE_M = 1_000_000;
const MAX_SECTION_CASES = 20_000;

export interface InputIssue {
  path: (string | number)[];
  message: string;
}

/**
 * Cross-field checks of a bonding study that has the right shape: references, geometry and
 * topology. Each issue names the field and says what to fix; an empty list means the core can
 * solve the study.
 */
export function checkBondingStudy(study: BondingStudy): InputIssue[] {
  const issues: InputIssue[] = [];
  const report = (path: (string | number)[], message: string) => issues.push({ path, message });

  for (const key of ['cableTypes', 'circuits', 'eccs', 'layouts', 'sections', 'cases'] as const) {
    const seen = new Set<string>();
    study[key].forEach((item, i) => {
      if (seen.has(item.id)) report([key, i, 'id'], `The identifier "${item.id}" is used twice; make each one unique.`);
      seen.add(item.id);
    });
  }
  const cableTypes = new Map(study.cableTypes.map((c) => [c.id, c]));
  const circuits = new Map(study.circuits.map((c) => [c.id, c]));
  const layouts = new Map(study.layouts.map((l) => [l.id, l]));
  const sections = new Map(study.sections.map((s, i) => [s.id, i]));

  study.circuits.forEach((c, i) => {
    if (!cableTypes.has(c.cableTypeId)) report(['circuits', i, 'cableTypeId'], `No cable type "${c.cableTypeId}": pick one from the cable types.`);
  });
  study.sections.forEach((s, i) => {
    if (!layouts.has(s.layoutId)) report(['sections', i, 'layoutId'], `No layout "${s.layoutId}": pick one of the layouts.`);
  });
  study.eccs.forEach((e, i) => {
    const from = sections.get(e.fromSectionId);
    const to = sections.get(e.toSectionId);
    if (from === undefined) report(['eccs', i, 'fromSectionId'], `No section "${e.fromSectionId}".`);
    if (to === undefined) report(['eccs', i, 'toSectionId'], `No section "${e.toSectionId}".`);
    if (from !== undefined && to !== undefined && from > to) report(['eccs', i, 'toSectionId'], 'The ECC must end at or after the section where it starts.');
    if (from !== undefined && to !== undefined && from <= to) checkEccCrossings(e, i, from, to + 1, report);
  });
  checkBondingLeadEntry(study, report);
  checkJointNames(study, report);
  if (study.circuits.length * 3 + study.eccs.length > MAX_CONDUCTORS) {
    report(['eccs'], `At most ${MAX_CONDUCTORS} sheaths and ECCs in one cross-section; this study has ${study.circuits.length * 3 + study.eccs.length} (three sheaths per circuit). Split the study.`);
  }
  if (study.sections.length * study.cases.length > MAX_SECTION_CASES) {
    report(['cases'], `${study.cases.length} cases on ${study.sections.length} sections is more than the ${MAX_SECTION_CASES} section-cases one calculation returns (each case gives figures for every section): split the cases over studies.`);
  }
  const routeM = study.sections.reduce((sum, x) => sum + x.lengthM, 0);
  if (routeM > MAX_ROUTE_M) report(['sections'], `The route is ${(routeM / 1000).toFixed(0)} km long, longer than any cable route (${MAX_ROUTE_M / 1000} km at most): check the units (metres).`);
  checkLayouts(study, report, circuits, cableTypes);
  checkBondingCoverage(study, report, sections);
  checkCases(study, report, circuits);
  if (issues.length) return issues;

  // ECC positions are needed in every section the ECC runs along.
  study.eccs.forEach((e, i) => {
    for (let s = sections.get(e.fromSectionId)!; s <= sections.get(e.toSectionId)!; s++) {
      const layout = layouts.get(study.sections[s].layoutId)!;
      if (!layout.eccs.some((p) => p.eccId === e.id)) {
        report(['eccs', i], `Section "${study.sections[s].id}" uses layout "${layout.id}", which gives no position for ECC "${e.id}". Add it to the layout.`);
      }
    }
  });
  if (issues.length) return issues;

  const topology = buildRouteTopology(study);
  const byUserJoint = new Map(topology.joints.filter((j) => j.userJointIndex !== undefined).map((j) => [j.userJointIndex!, j]));
  study.svls.forEach((svl, i) => {
    const joint = byUserJoint.get(svl.jointIndex);
    if (!joint) {
      report(['svls', i, 'jointIndex'], `Joint ${svl.jointIndex} does not exist: joints run from 0 to ${study.sections.length}.`);
      return;
    }
    const can = svlPlacement(joint);
    if (svl.connection === 'to-earth' && !can.toEarth) {
      report(['svls', i, 'jointIndex'], `Joint ${svl.jointIndex} has no open sheath end or cross-bonding link box, so an SVL to earth has nothing to protect there.`);
    }
    if (svl.connection === 'across-joint' && !can.acrossJoint) {
      report(['svls', i, 'jointIndex'], `Joint ${svl.jointIndex} has no sectionalising insulation for an SVL across the joint.`);
    }
  });
  const last = topology.joints.length - 1;
  const overridden = new Set<number>();
  study.earthing.overrides.forEach((o, i) => {
    const path = ['earthing', 'overrides', i, 'jointIndex'];
    const joint = byUserJoint.get(o.jointIndex);
    if (!joint) return report(path, `Joint ${o.jointIndex} does not exist: joints run from 0 to ${study.sections.length}.`);
    if (overridden.has(o.jointIndex)) return report(path, `Joint ${o.jointIndex} has two earthing overrides; keep one.`);
    overridden.add(o.jointIndex);
    if (!hasLocalEarth(topology, joint, joint.index === 0 || joint.index === last)) {
      return report(path, `Joint ${o.jointIndex} is a straight-through joint with no link box, so an electrode there connects to nothing: remove the override or change the bonding.`);
    }
    if (o.noElectrode) {
      const eccEnd = [...topology.eccSpans.values()].some((s) => s.fromJoint === joint.index || s.toJoint === joint.index);
      if (joint.join !== 'cross' || joint.earthLeft || joint.earthRight) {
        report(['earthing', 'overrides', i, 'noElectrode'], `Joint ${o.jointIndex} is not a cross-bonding link box: only a cross-bonding box can be installed without an electrode, since sheaths or ECCs are earthed here.`);
      } else if (eccEnd) {
        report(['earthing', 'overrides', i, 'noElectrode'], `Joint ${o.jointIndex}: an ECC ends here and must be bonded to an electrode.`);
      }
    }
  });
  return issues;
}

type Report = (path: (string | number)[], message: string) => void;

/** Transposition joints lie strictly inside the ECC's run (joints `first`…`last`), once each, and not besides "at the middle". */
function checkEccCrossings(e: BondingStudy['eccs'][number], i: number, first: number, last: number, report: Report) {
  const joints = e.transposedAtJoints ?? [];
  if (!joints.length) return;
  if (e.transposedAtMidpoint) {
    report(['eccs', i, 'transposedAtJoints'], `ECC "${e.id}": give its crossings either at the middle of its run or at joints, not both.`);
    return;
  }
  const seen = new Set<number>();
  joints.forEach((j, k) => {
    if (j <= first || j >= last) report(['eccs', i, 'transposedAtJoints', k], `Joint ${j} is not inside the run of ECC "${e.id}" (joints ${first + 1} to ${last - 1}); its ends are earthed, not crossed.`);
    else if (seen.has(j)) report(['eccs', i, 'transposedAtJoints', k], `Joint ${j} is named twice: crossing twice at one joint is no crossing.`);
    seen.add(j);
  });
}

/** The lead impedance is given one way: a total, or by length (with a resistance per metre, or a conductor to derive it from). */
function checkBondingLeadEntry(study: BondingStudy, report: Report) {
  const byLength = study.bondingLeadLength;
  if (!byLength) return;
  if (study.bondingLeadMilliohm) report(['bondingLeadMilliohm'], 'Give the bonding lead impedance either as a total or by length, not both: remove one.');
  if (byLength.resistanceMilliohmPerM === undefined && !study.bondingLeads) {
    report(['bondingLeadLength', 'resistanceMilliohmPerM'], "Give the lead resistance per metre, or the leads' cross-section and material (fault-current check) to derive it from.");
  }
}

/** Joint names name joints that exist, each joint once, each name once. */
function checkJointNames(study: BondingStudy, report: Report) {
  const joints = new Set<number>();
  const names = new Set<string>();
  (study.jointNames ?? []).forEach((n, i) => {
    if (n.jointIndex > study.sections.length) report(['jointNames', i, 'jointIndex'], `Joint ${n.jointIndex} does not exist: joints run from 0 to ${study.sections.length}.`);
    else if (joints.has(n.jointIndex)) report(['jointNames', i, 'jointIndex'], `Joint ${n.jointIndex} has two names; keep one.`);
    joints.add(n.jointIndex);
    const key = n.name.trim().toLowerCase();
    if (names.has(key)) report(['jointNames', i, 'name'], `The name "${n.name}" is given to two joints; make each one unique.`);
    names.add(key);
  });
}

function checkLayouts(study: BondingStudy, report: Report, circuits: Map<string, unknown>, cableTypes: Map<string, BondingStudy['cableTypes'][number]>) {
  study.layouts.forEach((layout, li) => {
    const placed = new Set<string>();
    const cables: Array<{ xM: number; depthM: number; radiusM: number; label: string }> = [];
    layout.circuits.forEach((c, ci) => {
      const path = ['layouts', li, 'circuits', ci];
      if (!circuits.has(c.circuitId)) return report([...path, 'circuitId'], `No circuit "${c.circuitId}".`);
      if (placed.has(c.circuitId)) return report([...path, 'circuitId'], `Circuit "${c.circuitId}" is placed twice in this layout.`);
      placed.add(c.circuitId);
      const type = cableTypes.get(study.circuits.find((x) => x.id === c.circuitId)!.cableTypeId);
      if (!type) return;
      const od = type.overallDiameterMm / 1000;
      if (c.formation !== 'coordinates' && c.spacingM < od * (1 - 1e-9)) {
        return report([...path, 'spacingM'], `The cables overlap: spacing ${c.spacingM} m is less than the cable's overall diameter ${od} m. Increase the spacing.`);
      }
      if (c.formation !== 'coordinates' && c.depthM < od) {
        report([...path, 'depthM'], `The cables would stand out of the ground: depth ${c.depthM} m is less than the formation needs.`);
      }
      cablePositions(c).forEach((p, k) => cables.push({ ...p, radiusM: od / 2, label: `${c.circuitId}-${'abc'[k]}` }));
    });
    study.circuits.forEach((c) => {
      if (!placed.has(c.id)) report(['layouts', li, 'circuits'], `Circuit "${c.id}" has no place in layout "${layout.id}". Add it.`);
    });
    for (let a = 0; a < cables.length; a++) {
      for (let b = a + 1; b < cables.length; b++) {
        const gap = Math.hypot(cables[a].xM - cables[b].xM, cables[a].depthM - cables[b].depthM);
        if (gap < (cables[a].radiusM + cables[b].radiusM) * (1 - 1e-9)) {
          report(['layouts', li, 'circuits'], `Cables ${cables[a].label} and ${cables[b].label} overlap (${gap.toFixed(3)} m apart, centre to centre). Move them apart.`);
        }
      }
    }
    layout.eccs.forEach((e, ei) => {
      if (!study.eccs.some((x) => x.id === e.eccId)) report(['layouts', li, 'eccs', ei, 'eccId'], `No ECC "${e.eccId}".`);
      const hit = cables.find((c) => Math.hypot(c.xM - e.xM, c.depthM - e.depthM) < c.radiusM);
      if (hit) report(['layouts', li, 'eccs', ei], `The ECC lies inside cable ${hit.label}. Move it clear of the cables.`);
    });
    const points = [...cables, ...layout.eccs.map((e) => ({ xM: e.xM, depthM: e.depthM }))];
    let widestM = 0;
    for (let a = 0; a < points.length; a++) {
      for (let b = a + 1; b < points.length; b++) widestM = Math.max(widestM, Math.hypot(points[a].xM - points[b].xM, points[a].depthM - points[b].depthM));
    }
    const depthM = earthReturnDepthM(study.soilResistivityOhmM, study.frequencyHz);
    if (depthM < MIN_DEPTH_TO_SPACING * widestM) {
      report(['soilResistivityOhmM'], `At ${study.soilResistivityOhmM} Ω·m the equivalent earth-return depth is ${depthM.toFixed(1)} m, not much larger than the ${widestM.toFixed(2)} m between conductors in layout "${layout.id}" (Carson's simplified formulae need at least ${MIN_DEPTH_TO_SPACING}×). Check the resistivity and its units (Ω·m).`);
    }
  });
}

function checkBondingCoverage(study: BondingStudy, report: Report, sections: Map<string, number>) {
  let next = 0;
  study.bonding.forEach((group, gi) => {
    if (group.kind === 'cross-bonded' && group.sectionIds.length !== 3) {
      report(['bonding', gi, 'sectionIds'], `A cross-bonded major section needs exactly three minor sections; this one has ${group.sectionIds.length}.`);
    }
    group.sectionIds.forEach((sid, k) => {
      const index = sections.get(sid);
      if (index === undefined) return report(['bonding', gi, 'sectionIds', k], `No section "${sid}".`);
      if (index !== next) {
        report(['bonding', gi, 'sectionIds', k], `Section "${sid}" is out of route order here: bonding groups must cover the sections once each, in order (expected "${study.sections[next]?.id ?? '(none)'}").`);
      }
      next = index + 1;
    });
  });
  if (next !== study.sections.length) {
    report(['bonding'], `Sections after "${study.sections[next - 1]?.id ?? '(start)'}" have no bonding arrangement. Add them to a group.`);
  }
}

function checkCases(study: BondingStudy, report: Report, circuits: Map<string, unknown>) {
  study.cases.forEach((c, i) => {
    const seen = new Set<string>();
    c.currents.forEach((cur, k) => {
      if (!circuits.has(cur.circuitId)) report(['cases', i, 'currents', k, 'circuitId'], `No circuit "${cur.circuitId}".`);
      if (seen.has(cur.circuitId)) report(['cases', i, 'currents', k, 'circuitId'], `Circuit "${cur.circuitId}" has two currents in this case.`);
      seen.add(cur.circuitId);
    });
    const isFault = c.kind !== 'normal' && c.kind !== 'emergency';
    const at = (...rest: (string | number)[]) => ['cases', i, ...rest];
    if (isFault && c.durationS === undefined) report(at('durationS'), 'A fault case needs its duration, including back-up clearance.');
    const needs = { 'earth-fault': 'earthFault', 'phase-phase-earth-fault': 'phasePhaseEarthFault', 'internal-fault': 'internalFault' } as const;
    for (const [kind, key] of Object.entries(needs) as Array<[keyof typeof needs, (typeof needs)[keyof typeof needs]]>) {
      if (c.kind === kind && !c[key]) report(at(key), `A case of kind "${kind}" needs ${key === 'internalFault' ? 'the faulted circuit, phase, place and infeeds' : 'the faulted circuit, phase and current'}.`);
      if (c.kind !== kind && c[key]) report(at(key), `Only a case of kind "${kind}" has "${key}"; this case is "${c.kind}".`);
      const f = c[key];
      if (c.kind === kind && f && !circuits.has(f.circuitId)) report(at(key, 'circuitId'), `No circuit "${f.circuitId}": the fault must be on a circuit of this study.`);
    }
    if (c.kind === 'phase-phase-earth-fault' && c.phasePhaseEarthFault && c.phasePhaseEarthFault.phases[0] === c.phasePhaseEarthFault.phases[1]) {
      report(at('phasePhaseEarthFault', 'phases'), 'Name two different phases.');
    }
    if (c.kind === 'internal-fault' && c.internalFault) {
      const f = c.internalFault;
      const routeM = study.sections.reduce((sum, x) => sum + x.lengthM, 0);
      if ((f.jointIndex === undefined) === (f.chainageM === undefined)) report(at('internalFault', 'jointIndex'), 'Place the fault either at a joint or at a chainage, not both and not neither.');
      else if (f.jointIndex !== undefined && f.jointIndex > study.sections.length) report(at('internalFault', 'jointIndex'), `Joint ${f.jointIndex} does not exist: joints run from 0 to ${study.sections.length}.`);
      else if (f.chainageM !== undefined && f.chainageM >= routeM) report(at('internalFault', 'chainageM'), `The fault at ${f.chainageM} m lies beyond the route end (${routeM} m).`);
      if (f.fromStart.currentA === 0 && f.fromEnd.currentA === 0) report(at('internalFault', 'fromStart'), 'Give the infeed from the start, the end or both.');
    }
    if (c.kind === 'station-gpr' && !c.stationGpr.length) report(at('stationGpr'), 'A station-rise case needs the rise at one station or both.');
    if (!isFault && c.stationGpr.length) report(at('stationGpr'), 'A station earth rise belongs to a fault case, not a load case.');
    if (new Set(c.stationGpr.map((g) => g.station)).size !== c.stationGpr.length) report(at('stationGpr'), 'Give each station once.');
    if (c.kind === 'normal' || c.kind === 'emergency' || c.kind === 'three-phase-fault') {
      if (!c.currents.some((cur) => cur.currentA > 0)) report(at('currents'), 'Give a current above zero for at least one circuit.');
    }
  });
}
