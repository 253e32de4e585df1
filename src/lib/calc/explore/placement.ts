import type { BondingStudy } from '../../schemas/bonding-study.schema';
import { crossBondImbalanceM } from '../closed-form';
import { ExploreError } from './errors';

// Joint-bay placement for cross-bonded major sections. With balanced currents and the same
// cross-section along a major section, the residual EMF of a cross-bonded sheath path is
// E·√(a²+b²+c²−ab−bc−ca) (closed-form.ts: crossBondResidualV) and the standing voltage at a
// cross-bonding link box grows with the longest minor section (E·L). Both are least at equal
// minor sections, the closed-form optimum; windows and the drum length may forbid it, and the
// search then finds the best feasible pair of joint positions.

export interface PlacementRequest {
  /** Chainages along the route where a joint bay may go; empty: anywhere. */
  windows: Array<{ fromM: number; toM: number }>;
  /** Longest minor section one cable drum allows, m. */
  drumLengthM: number;
  /** Shortest minor section accepted, m. */
  minMinorLengthM?: number;
}

export interface MajorSectionPlacement {
  sectionIds: [string, string, string];
  startM: number;
  endM: number;
  currentLengthsM: [number, number, number];
  suggestedLengthsM: [number, number, number] | null;
  /** Residual EMF share √(a²+b²+c²−ab−bc−ca)/(a+b+c) in %, current and suggested (0 at equal lengths). */
  currentImbalancePct: number;
  suggestedImbalancePct: number | null;
  /** Current joints outside the windows, or minor sections over the drum length. */
  currentViolations: string[];
  reason?: string;
}

export interface Placement {
  majorSections: MajorSectionPlacement[];
  /** The study with every feasible suggestion applied (lengths only); null when none is feasible. */
  suggestedStudy: BondingStudy | null;
}

/** Objective: residual share plus longest minor section, both relative to the major length. */
function objective(a: number, b: number, c: number): number {
  const L = a + b + c;
  return crossBondImbalanceM(a, b, c) / L + Math.max(a, b, c) / L;
}

type Interval = [number, number];

function allowed(windows: Interval[], lo: number, hi: number): Interval[] {
  if (!windows.length) return lo <= hi ? [[lo, hi]] : [];
  return windows.flatMap(([a, b]): Interval[] => {
    const x = Math.max(a, lo);
    const y = Math.min(b, hi);
    return x <= y ? [[x, y]] : [];
  });
}

/** Minimises a convex function of two joint positions over a box by a shrinking grid (the objective is convex; the feasible set is an intersection of half-planes). */
function minimiseBox(f: (x1: number, x2: number) => number, i1: Interval, i2: Interval): { x1: number; x2: number; value: number } | null {
  let best: { x1: number; x2: number; value: number } | null = null;
  let [a1, b1] = i1;
  let [a2, b2] = i2;
  const N = 40;
  for (let round = 0; round < 30; round++) {
    for (let p = 0; p <= N; p++) {
      const x1 = a1 + ((b1 - a1) * p) / N;
      for (let q = 0; q <= N; q++) {
        const x2 = a2 + ((b2 - a2) * q) / N;
        const v = f(x1, x2);
        if (Number.isFinite(v) && (!best || v < best.value - 1e-15)) best = { x1, x2, value: v };
      }
    }
    if (!best) return null;
    const h1 = (b1 - a1) / N;
    const h2 = (b2 - a2) / N;
    if (h1 < 1e-4 && h2 < 1e-4) break;
    [a1, b1] = [Math.max(i1[0], best.x1 - 2 * h1), Math.min(i1[1], best.x1 + 2 * h1)];
    [a2, b2] = [Math.max(i2[0], best.x2 - 2 * h2), Math.min(i2[1], best.x2 + 2 * h2)];
  }
  return best;
}

const round2 = (x: number) => Math.round(x * 100) / 100;

export function suggestPlacement(study: BondingStudy, request: PlacementRequest): Placement {
  if (!(request.drumLengthM > 0)) throw new ExploreError('Give the drum length limit in metres, above zero.', 'drumLengthM');
  const minLen = request.minMinorLengthM ?? 1;
  const windows: Interval[] = request.windows.map((w, i) => {
    if (!(w.toM >= w.fromM)) throw new ExploreError('A window must end at or after its start.', `windows.${i}.toM`);
    return [w.fromM, w.toM];
  });
  const start = new Map<string, number>();
  let x = 0;
  for (const s of study.sections) {
    start.set(s.id, x);
    x += s.lengthM;
  }
  const lengthOf = new Map(study.sections.map((s) => [s.id, s.lengthM]));
  const inWindow = (c: number) => !windows.length || windows.some(([a, b]) => c >= a - 1e-9 && c <= b + 1e-9);

  const majors = study.bonding.filter((g) => g.kind === 'cross-bonded' && g.sectionIds.length === 3);
  if (!majors.length) throw new ExploreError('The study has no cross-bonded major section to place joint bays in.', 'bonding');
  const newLengths = new Map<string, number>();
  const majorSections = majors.map((g): MajorSectionPlacement => {
    const ids = g.sectionIds as [string, string, string];
    const current = ids.map((id) => lengthOf.get(id)!) as [number, number, number];
    const s0 = start.get(ids[0])!;
    const end = s0 + current[0] + current[1] + current[2];
    const L = end - s0;
    const violations: string[] = [];
    [s0 + current[0], s0 + current[0] + current[1]].forEach((c, k) => inWindow(c) || violations.push(`Joint ${k + 1} of the major section at ${c.toFixed(1)} m lies outside every window.`));
    current.forEach((len, k) => len > request.drumLengthM + 1e-9 && violations.push(`Minor section ${ids[k]} (${len.toFixed(1)} m) is longer than a drum (${request.drumLengthM} m).`));
    const base = { sectionIds: ids, startM: s0, endM: end, currentLengthsM: current, currentImbalancePct: (100 * crossBondImbalanceM(...current)) / L, currentViolations: violations };

    const f = (x1: number, x2: number) => {
      const a = x1 - s0;
      const b = x2 - x1;
      const c = end - x2;
      if (a < minLen || b < minLen || c < minLen) return Infinity;
      if (a > request.drumLengthM || b > request.drumLengthM || c > request.drumLengthM) return Infinity;
      return objective(a, b, c);
    };
    const first = allowed(windows, s0 + minLen, end - 2 * minLen);
    const second = allowed(windows, s0 + 2 * minLen, end - minLen);
    let best: { x1: number; x2: number; value: number } | null = null;
    for (const i1 of first) for (const i2 of second) {
      if (i2[1] <= i1[0]) continue;
      const found = minimiseBox(f, i1, i2);
      if (found && (!best || found.value < best.value)) best = found;
    }
    if (!best) return { ...base, suggestedLengthsM: null, suggestedImbalancePct: null, reason: 'No pair of joint positions fits the windows and the drum length.' };
    const a = round2(best.x1 - s0);
    const b = round2(best.x2 - best.x1);
    const suggested: [number, number, number] = [a, b, round2(L - a - b)];
    suggested.forEach((len, k) => newLengths.set(ids[k], len));
    return { ...base, suggestedLengthsM: suggested, suggestedImbalancePct: (100 * crossBondImbalanceM(...suggested)) / L };
  });
  const suggestedStudy = newLengths.size ? { ...study, sections: study.sections.map((s) => (newLengths.has(s.id) ? { ...s, lengthM: newLengths.get(s.id)! } : s)) } : null;
  return { majorSections, suggestedStudy };
}
