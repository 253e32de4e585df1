import type { BondingStudy, StudyCase } from '../../schemas/bonding-study.schema';
import type { LimitSet } from '../../schemas/limit-set.schema';
import { ExploreError } from './errors';
import { evaluateStudy, type CheckedQuantity } from './evaluate';
import { SWEEP_LIMITS, gridPointCount } from './sweep-limits';

// Sensitivity sweeps: one or two inputs over a grid, every case recomputed at each point.
// Each point is the base study with the swept inputs set, calculated exactly as a single
// calculation would be, so a point can be reproduced by hand.

export type SweepInput =
  | { kind: 'soil-resistivity' }
  | { kind: 'phase-spacing' }
  | { kind: 'depth' }
  | { kind: 'section-length'; sectionId: string }
  | { kind: 'load-current' }
  | { kind: 'fault-current' }
  | { kind: 'earth-resistance'; at: 'link-boxes' | 'route-start' | 'route-end' };

export interface SweepAxis {
  input: SweepInput;
  fromValue: number;
  toValue: number;
  /** Grid points along this axis, ends included. */
  points: number;
}

export { SWEEP_LIMITS } from './sweep-limits';

export function inputLabel(input: SweepInput): string {
  switch (input.kind) {
    case 'soil-resistivity':
      return 'Soil resistivity, Ω·m';
    case 'phase-spacing':
      return 'Cable spacing (every trefoil and flat formation), m';
    case 'depth':
      return 'Laying depth (every formation), m';
    case 'section-length':
      return `Length of section ${input.sectionId}, m`;
    case 'load-current':
      return 'Largest normal-load current (all load cases scaled), A';
    case 'fault-current':
      return 'Largest fault current (all fault cases scaled), A';
    case 'earth-resistance':
      return input.at === 'link-boxes' ? 'Earth resistance at link boxes, Ω' : `Earth resistance at the route ${input.at === 'route-start' ? 'start' : 'end'}, Ω`;
  }
}

/** Grid values of one axis, evenly spaced, ends exact. */
export function axisValues(axis: SweepAxis): number[] {
  if (axis.points === 1) return [axis.fromValue];
  return Array.from({ length: axis.points }, (_, k) => (k === axis.points - 1 ? axis.toValue : axis.fromValue + ((axis.toValue - axis.fromValue) * k) / (axis.points - 1)));
}

/** Refuses a sweep the core will not run, naming the field; returns the number of grid points. */
export function checkSweep(study: BondingStudy, axes: SweepAxis[]): number {
  if (axes.length < 1 || axes.length > SWEEP_LIMITS.maxAxes) throw new ExploreError('Sweep one or two inputs.', 'axes');
  axes.forEach((a, i) => {
    const f = `axes.${i}`;
    if (!Number.isInteger(a.points) || a.points < 1) throw new ExploreError('The number of points must be a whole number of at least 1.', `${f}.points`);
    if (a.points > SWEEP_LIMITS.maxPointsPerAxis) throw new ExploreError(`At most ${SWEEP_LIMITS.maxPointsPerAxis} points along one input; this asks for ${a.points}.`, `${f}.points`);
    if (!(a.fromValue > 0) || !(a.toValue > 0)) throw new ExploreError(`${inputLabel(a.input)}: the range must lie above zero.`, `${f}.fromValue`);
    if (a.input.kind === 'section-length') {
      const id = a.input.sectionId;
      if (!study.sections.some((s) => s.id === id)) throw new ExploreError(`No section "${id}" in the study.`, `${f}.input.sectionId`);
    }
    if ((a.input.kind === 'phase-spacing' || a.input.kind === 'depth') && !study.layouts.some((l) => l.circuits.some((c) => c.formation !== 'coordinates'))) {
      if (a.input.kind === 'phase-spacing') throw new ExploreError('No trefoil or flat formation in the study: cable spacing cannot be swept.', `${f}.input`);
    }
    if (a.input.kind === 'load-current' && baseLoadA(study) <= 0) throw new ExploreError('The study has no normal-load current to scale.', `${f}.input`);
    if (a.input.kind === 'fault-current' && baseFaultA(study) <= 0) throw new ExploreError('The study has no fault case to scale.', `${f}.input`);
  });
  if (axes.length === 2 && JSON.stringify(axes[0].input) === JSON.stringify(axes[1].input)) throw new ExploreError('Sweep two different inputs.', 'axes.1.input');
  const total = gridPointCount(axes);
  if (total > SWEEP_LIMITS.maxPoints) {
    throw new ExploreError(`A sweep of ${total.toLocaleString('en-GB')} grid points is over the limit of ${SWEEP_LIMITS.maxPoints.toLocaleString('en-GB')}; use fewer points.`, 'axes');
  }
  return total;
}

const isLoad = (c: StudyCase) => c.kind === 'normal' || c.kind === 'emergency';
const baseLoadA = (s: BondingStudy) => Math.max(0, ...s.cases.filter((c) => c.kind === 'normal').flatMap((c) => c.currents.map((x) => x.currentA)));

function faultCurrentsOf(c: StudyCase): number[] {
  if (isLoad(c)) return [];
  const out: number[] = [];
  if (c.kind === 'three-phase-fault') out.push(...c.currents.map((x) => x.currentA));
  if (c.earthFault) out.push(c.earthFault.currentA);
  if (c.phasePhaseEarthFault) out.push(...c.phasePhaseEarthFault.currents.map((x) => x.currentA));
  if (c.internalFault) out.push(c.internalFault.fromStart.currentA, c.internalFault.fromEnd.currentA);
  return out;
}
const baseFaultA = (s: BondingStudy) => Math.max(0, ...s.cases.flatMap(faultCurrentsOf));

/** Fault currents of a case multiplied by k; the load currents flowing in an earth-fault case stay. */
function scaleFault(c: StudyCase, k: number): StudyCase {
  if (isLoad(c)) return c;
  return {
    ...c,
    currents: c.kind === 'three-phase-fault' ? c.currents.map((x) => ({ ...x, currentA: x.currentA * k })) : c.currents,
    earthFault: c.earthFault && { ...c.earthFault, currentA: c.earthFault.currentA * k },
    phasePhaseEarthFault: c.phasePhaseEarthFault && { ...c.phasePhaseEarthFault, currents: c.phasePhaseEarthFault.currents.map((x) => ({ ...x, currentA: x.currentA * k })) as typeof c.phasePhaseEarthFault.currents },
    internalFault: c.internalFault && { ...c.internalFault, fromStart: { ...c.internalFault.fromStart, currentA: c.internalFault.fromStart.currentA * k }, fromEnd: { ...c.internalFault.fromEnd, currentA: c.internalFault.fromEnd.currentA * k } },
  };
}

/** The base study with one input set to a value; the base study is not changed. */
export function applyInput(study: BondingStudy, input: SweepInput, value: number): BondingStudy {
  switch (input.kind) {
    case 'soil-resistivity':
      return { ...study, soilResistivityOhmM: value };
    case 'phase-spacing':
      return { ...study, layouts: study.layouts.map((l) => ({ ...l, circuits: l.circuits.map((c) => (c.formation === 'coordinates' ? c : { ...c, spacingM: value })) })) };
    case 'depth':
      return {
        ...study,
        layouts: study.layouts.map((l) => ({
          ...l,
          circuits: l.circuits.map((c) => {
            if (c.formation !== 'coordinates') return { ...c, depthM: value };
            // Coordinates: the group moves so its mean depth is the value.
            const shift = value - c.positions.reduce((s, p) => s + p.depthM, 0) / 3;
            return { ...c, positions: c.positions.map((p) => ({ ...p, depthM: p.depthM + shift })) };
          }),
        })),
      };
    case 'section-length':
      return { ...study, sections: study.sections.map((s) => (s.id === input.sectionId ? { ...s, lengthM: value } : s)) };
    case 'load-current': {
      const k = value / baseLoadA(study);
      return { ...study, cases: study.cases.map((c) => (isLoad(c) ? { ...c, currents: c.currents.map((x) => ({ ...x, currentA: x.currentA * k })) } : c)) };
    }
    case 'fault-current': {
      const k = value / baseFaultA(study);
      return { ...study, cases: study.cases.map((c) => scaleFault(c, k)) };
    }
    case 'earth-resistance': {
      const key = input.at === 'link-boxes' ? 'linkBoxOhm' : input.at === 'route-start' ? 'routeStartOhm' : 'routeEndOhm';
      return { ...study, earthing: { ...study.earthing, [key]: value } };
    }
  }
}

/** The input's value in the base study, for the tornado's centre and the current-design mark. */
export function baseValue(study: BondingStudy, input: SweepInput): number | null {
  switch (input.kind) {
    case 'soil-resistivity':
      return study.soilResistivityOhmM;
    case 'phase-spacing':
    case 'depth': {
      for (const c of study.layouts.flatMap((l) => l.circuits)) if (c.formation !== 'coordinates') return input.kind === 'depth' ? c.depthM : c.spacingM;
      return null;
    }
    case 'section-length':
      return study.sections.find((s) => s.id === input.sectionId)?.lengthM ?? null;
    case 'load-current':
      return baseLoadA(study);
    case 'fault-current':
      return baseFaultA(study);
    case 'earth-resistance':
      return input.at === 'link-boxes' ? study.earthing.linkBoxOhm : input.at === 'route-start' ? study.earthing.routeStartOhm : study.earthing.routeEndOhm;
  }
}

export interface SweepPoint {
  /** One value per axis. */
  values: number[];
  quantities?: CheckedQuantity[];
  worstMarginPct?: number | null;
  failing?: string[];
  /** Why this point could not be calculated (e.g. cables overlapping at this spacing). */
  error?: string;
}

/** Grid index → axis values: the first axis runs fastest. */
export function gridValues(axes: SweepAxis[], index: number): number[] {
  const values: number[] = [];
  let rest = index;
  for (const a of axes) {
    values.push(axisValues(a)[rest % a.points]);
    rest = Math.floor(rest / a.points);
  }
  return values;
}

export function studyAt(base: BondingStudy, axes: SweepAxis[], values: number[]): BondingStudy {
  return axes.reduce((s, a, k) => applyInput(s, a.input, values[k]), base);
}

/** One grid point, calculated. */
export function sweepPoint(base: BondingStudy, limits: LimitSet, axes: SweepAxis[], index: number): SweepPoint {
  const values = gridValues(axes, index);
  // Checks only: a point compares checked figures, and the screens' extras would double its cost.
  const e = evaluateStudy(studyAt(base, axes, values), limits, 'checks');
  if (!e.ok) return { values, error: e.error };
  return { values, quantities: e.figures.quantities, worstMarginPct: e.figures.worstMarginPct, failing: e.figures.failing };
}

export interface FirstFailure {
  criterion: string;
  /** Axis values of the first failing point along the grid order (first axis fastest). */
  values: number[];
  index: number;
}

/** Where each check starts to fail: the first grid point (in grid order) where it fails. */
export function firstFailures(points: SweepPoint[]): FirstFailure[] {
  const seen = new Map<string, FirstFailure>();
  points.forEach((p, index) => (p.failing ?? []).forEach((criterion) => seen.has(criterion) || seen.set(criterion, { criterion, values: p.values, index })));
  return [...seen.values()];
}
