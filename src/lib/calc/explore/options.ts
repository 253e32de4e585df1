import type { BondingStudy, Layout } from '../../schemas/bonding-study.schema';
import type { LimitSet } from '../../schemas/limit-set.schema';
import type { BondingResults } from '../bonding/results';
import { standingVoltages } from '../bonding/worst-values';
import { buildRouteTopology, svlPlacement } from '../bonding/route-topology';
import { evaluateStudy } from './evaluate';

// Bonding options appraisal: the base study's route, circuits and cases under each bonding
// arrangement, side by side. Each option is a study derived from the base one; nothing else
// about the route changes.

export type BondingOptionKey = 'current' | 'solid' | 'single-point-start' | 'single-point-end' | 'single-point-middle' | 'cross-bonded' | 'mixed';

export const OPTION_LABELS: Record<BondingOptionKey, string> = {
  current: 'Current design',
  solid: 'Solidly bonded at every current earthing position',
  'single-point-start': 'Single-point, earthed at the start of each group, with ECC',
  'single-point-end': 'Single-point, earthed at the end of each group, with ECC',
  'single-point-middle': 'Single-point, earthed in the middle of each group, with ECC',
  'cross-bonded': 'Cross-bonded at the current joints (three minor sections per major section)',
  mixed: 'Mixed: cross-bonded major sections, the remaining sections single-point with ECC',
};

/**
 * The ECC added to single-point options when the study has none: 300 mm² copper, 0.0601 Ω/km
 * (IEC 60228 class 2 at 20 °C, from memory), GMR 0.758·r of a 19-wire conductor (common
 * practice), 0.3 m beside the outermost cable at the cables' mean depth. An assumption of the
 * appraisal, stated with the option.
 */
const ASSUMED_ECC = { id: 'ECC-appraisal', resistanceOhmPerKm: 0.0601, gmrMm: 7.4, crossSectionMm2: 300, offsetM: 0.3 } as const;

export interface BondingOption {
  key: BondingOptionKey;
  label: string;
  /** The derived study; null when the option does not fit this route. */
  study: BondingStudy | null;
  notAvailable?: string;
  assumptions: string[];
}

function groupsInOrder(study: BondingStudy): string[][] {
  return study.bonding.map((g) => g.sectionIds).filter((ids) => ids.length > 0);
}

function triples(ids: string[]): string[][] {
  return Array.from({ length: Math.floor(ids.length / 3) }, (_, k) => ids.slice(3 * k, 3 * k + 3));
}

/** Rightmost cable centre and mean cable depth of a layout, for placing an assumed ECC. */
function layoutExtent(layout: Layout): { rightM: number; depthM: number } {
  const xs: number[] = [];
  const ds: number[] = [];
  for (const c of layout.circuits) {
    if (c.formation === 'coordinates') c.positions.forEach((p) => (xs.push(p.xM), ds.push(p.depthM)));
    else {
      xs.push(c.centreXM + (c.formation === 'flat' ? c.spacingM : c.spacingM / 2));
      ds.push(c.depthM);
    }
  }
  return { rightM: Math.max(...xs), depthM: ds.reduce((s, d) => s + d, 0) / ds.length };
}

function withEcc(study: BondingStudy, assumptions: string[]): BondingStudy {
  if (study.eccs.length > 0) return study;
  assumptions.push(`ECC added for the appraisal: ${ASSUMED_ECC.crossSectionMm2} mm² copper, ${ASSUMED_ECC.resistanceOhmPerKm} Ω/km, ${ASSUMED_ECC.offsetM} m beside the outermost cable, along the whole route, earthed at both ends and transposed at its midpoint (common practice: cancels most of the EMF the load induces in it).`);
  const sections = study.sections;
  return {
    ...study,
    eccs: [{ id: ASSUMED_ECC.id, name: 'ECC assumed for the appraisal', resistanceOhmPerKm: ASSUMED_ECC.resistanceOhmPerKm, gmrMm: ASSUMED_ECC.gmrMm, fromSectionId: sections[0].id, toSectionId: sections[sections.length - 1].id, transposedAtMidpoint: true, crossSectionMm2: ASSUMED_ECC.crossSectionMm2, material: 'copper' }],
    layouts: study.layouts.map((l) => {
      const e = layoutExtent(l);
      return { ...l, eccs: [...l.eccs, { eccId: ASSUMED_ECC.id, xM: e.rightM + ASSUMED_ECC.offsetM, depthM: e.depthM }] };
    }),
  };
}

/**
 * SVLs of an option: the base study's first SVL rating at every joint that has an open sheath
 * end or a cross-bonding link box (common practice: each such box carries SVLs to earth).
 * Without SVLs in the base study, none are added.
 */
function withSvls(study: BondingStudy, base: BondingStudy, assumptions: string[]): BondingStudy {
  const template = base.svls[0];
  if (!template) return { ...study, svls: [] };
  const joints = buildRouteTopology({ ...study, svls: [] }).joints.filter((j) => j.userJointIndex !== undefined && svlPlacement(j).toEarth);
  assumptions.push(`SVLs to earth at every open end and cross-bonding link box, rated as the study's first SVL (${template.continuousRatingV} V continuous, ${template.tovRatingV} V temporary).`);
  return { ...study, svls: joints.map((j) => ({ ...template, jointIndex: j.userJointIndex!, connection: 'to-earth' as const })) };
}

const sameBonding = (a: BondingStudy, b: BondingStudy) => JSON.stringify(a.bonding) === JSON.stringify(b.bonding);

/** Every bonding option derived from the base study, the current design first. */
export function bondingOptions(base: BondingStudy): BondingOption[] {
  const groups = groupsInOrder(base);
  const allIds = base.sections.map((s) => s.id);
  const make = (key: BondingOptionKey, bonding: BondingStudy['bonding'], needsEcc: boolean): BondingOption => {
    const assumptions: string[] = [];
    let study: BondingStudy = { ...base, bonding };
    if (needsEcc) study = withEcc(study, assumptions);
    study = withSvls(study, base, assumptions);
    return { key, label: OPTION_LABELS[key], study, assumptions };
  };
  const unavailable = (key: BondingOptionKey, why: string): BondingOption => ({ key, label: OPTION_LABELS[key], study: null, notAvailable: why, assumptions: [] });

  const options: BondingOption[] = [{ key: 'current', label: OPTION_LABELS.current, study: base, assumptions: [] }];
  options.push(make('solid', groups.map((sectionIds) => ({ kind: 'solid' as const, sectionIds })), false));
  for (const earthedAt of ['start', 'end', 'middle'] as const) {
    options.push(make(`single-point-${earthedAt}`, groups.map((sectionIds) => ({ kind: 'single-point' as const, sectionIds, earthedAt })), true));
  }
  if (allIds.length % 3 === 0) options.push(make('cross-bonded', triples(allIds).map((sectionIds) => ({ kind: 'cross-bonded' as const, sectionIds })), false));
  else options.push(unavailable('cross-bonded', `Cross-bonding needs the route in major sections of three minor sections; this route has ${allIds.length} sections, not a multiple of three.`));
  if (allIds.length >= 3 && allIds.length % 3 !== 0) {
    const crossed = triples(allIds);
    const rest = allIds.slice(crossed.length * 3);
    options.push(make('mixed', [...crossed.map((sectionIds) => ({ kind: 'cross-bonded' as const, sectionIds })), { kind: 'single-point' as const, sectionIds: rest, earthedAt: 'start' as const }], true));
  } else {
    options.push(unavailable('mixed', allIds.length < 3 ? 'A mixed arrangement needs at least one major section of three sections.' : 'Every section falls in a cross-bonded major section: the cross-bonded option covers the route.'));
  }
  return options;
}

export interface OptionRow {
  key: BondingOptionKey;
  label: string;
  /** This option's bonding equals the current design's. */
  isCurrent: boolean;
  notAvailable?: string;
  assumptions: string[];
  figures?: {
    /** Worst sheath voltage to the local earth at link boxes and open ends over the normal-load cases, V. */
    worstStandingV: number | null;
    worstStandingWhere: string;
    /** Largest sheath loss factor λ1 over normal-load cases. */
    lossFactor: number | null;
    /** Sheath losses of all cables at the normal-load case with the most, kW per km of route. */
    lossesKwPerKm: number | null;
    lossCaseId: string | null;
    /** Worst sheath voltage during faults (larger of to remote and to local earth), V. */
    faultSheathV: number | null;
    /** Worst voltage across sectionalising insulation during faults, V. */
    jointFaultV: number | null;
    /** Largest SVL voltage as a share of its rating (continuous in load, temporary in faults), %; null without SVLs. */
    svlDutyPct: number | null;
    linkBoxes: number;
    worstMarginPct: number | null;
    failing: string[];
  };
}

export interface Appraisal {
  rows: OptionRow[];
}

/** Sheath losses, kW/km of route: Σ λ1·I²·R over the cables (IEC 60287-1-1 §2.3: λ1 is sheath loss over conductor loss). */
function sheathLossesKwPerKm(study: BondingStudy, results: BondingResults): { kw: number; caseId: string } | null {
  let best: { kw: number; caseId: string } | null = null;
  for (const c of results.cases) {
    if (c.kind !== 'normal' || !c.lossFactors.length) continue;
    const source = study.cases.find((x) => x.id === c.caseId)!;
    let w = 0;
    for (const l of c.lossFactors) {
      const circuitId = l.cable.slice(0, l.cable.lastIndexOf('-'));
      const circuit = study.circuits.find((x) => x.id === circuitId)!;
      const type = study.cableTypes.find((t) => t.id === circuit.cableTypeId)!;
      const current = source.currents.find((x) => x.circuitId === circuitId)?.currentA ?? 0;
      w += l.lossFactor * current ** 2 * type.conductorResistanceOhmPerKm;
    }
    if (!best || w / 1000 > best.kw) best = { kw: w / 1000, caseId: c.caseId };
  }
  return best;
}

/** Link boxes: every joint that is not a straight joint, route ends excluded, and every mid-point earthing. */
export function countLinkBoxes(study: BondingStudy): number {
  const t = buildRouteTopology(study);
  return t.joints.filter((j, i) => i > 0 && i < t.joints.length - 1 && (j.join !== 'straight' || j.earthLeft || j.earthRight)).length;
}

const maxOrNull = (xs: number[]) => (xs.length ? Math.max(...xs) : null);

/** Calculates every option against the limit set. */
export function appraiseBondingOptions(base: BondingStudy, limits: LimitSet): Appraisal {
  const rows = bondingOptions(base).map((option): OptionRow => {
    const row: OptionRow = { key: option.key, label: option.label, isCurrent: option.study !== null && sameBonding(option.study, base), assumptions: option.assumptions };
    if (!option.study) return { ...row, notAvailable: option.notAvailable };
    const e = evaluateStudy(option.study, limits);
    if (!e.ok) return { ...row, notAvailable: e.error };
    const r = e.results;
    const standing = r.cases.filter((c) => c.kind === 'normal').flatMap(standingVoltages);
    const top = standing.reduce<{ value: number; where: string } | null>((b, s) => (!b || s.value > b.value ? s : b), null);
    const worst = (q: string) => r.worst.find((w) => w.quantity === q)?.value ?? null;
    const losses = sheathLossesKwPerKm(option.study, r);
    const svlDuty = e.items.filter((i) => (i.criterion === 'svl-continuous' || i.criterion === 'svl-tov') && i.limit).map((i) => (100 * i.value) / i.limit!);
    return {
      ...row,
      figures: {
        worstStandingV: top?.value ?? null,
        worstStandingWhere: top?.where ?? '',
        lossFactor: maxOrNull(r.cases.filter((c) => c.kind === 'normal').flatMap((c) => c.lossFactors.map((l) => l.lossFactor))),
        lossesKwPerKm: losses?.kw ?? null,
        lossCaseId: losses?.caseId ?? null,
        faultSheathV: worst('sheath-voltage-fault'),
        jointFaultV: worst('joint-voltage-fault'),
        svlDutyPct: maxOrNull(svlDuty),
        linkBoxes: countLinkBoxes(option.study),
        worstMarginPct: e.figures.worstMarginPct,
        failing: e.figures.failing,
      },
    };
  });
  return { rows };
}
