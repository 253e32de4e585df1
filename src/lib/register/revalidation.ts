import type { ReviewReason, SystemData } from '../db/schema/register';
import { formatNumber } from '../format';

/**
 * Which of an issued study's assumptions a site's new network data makes non-conservative, each
 * with the field a new revision would change. Pure: the study's stored inputs in, reasons out.
 *
 * The comparisons (common practice for keeping a bonding study valid):
 * - earth-fault and three-phase through-fault currents below the site's new fault level;
 * - a fault duration shorter than the new clearance time;
 * - a station grid resistance below the new one (a higher grid resistance raises the rise of
 *   earth potential carried into the sheaths), at the route end the site stands at, or at
 *   both ends when the link does not say;
 * - a normal-load current below the circuit's new maximum load.
 * Exposure studies are compared on their fault cases (current and duration) only: their
 * sources are not circuits of the register.
 */

interface LooseCase {
  id: string;
  name: string;
  kind: string;
  durationS?: number;
  currents?: Array<{ circuitId?: string; sourceId?: string; currentA: number }>;
  earthFault?: { currentA: number };
}

interface LooseInputs {
  kind: 'bonding' | 'exposure';
  circuits?: Array<{ id: string }>;
  earthing?: { routeStartOhm: number; routeEndOhm: number };
  cases: LooseCase[];
}

export interface ReviewContext {
  /** The study is linked to the site itself (fault levels, clearance, grid). */
  siteLinked: boolean;
  siteEnd: 'start' | 'end' | null;
  /** New maximum loads of circuits this study covers, with the circuit inside the study they apply to. */
  circuitLoads: Array<{ assetCode: string; studyCircuitId: string | null; maxLoadA: number }>;
}

const FAULT_KINDS = new Set(['three-phase-fault', 'earth-fault', 'phase-phase-earth-fault', 'internal-fault', 'fault']);

const kA = (a: number) => `${formatNumber(a / 1000)} kA`;

export function reviewReasons(raw: unknown, data: SystemData, ctx: ReviewContext): ReviewReason[] {
  const inputs = raw as LooseInputs;
  const reasons: ReviewReason[] = [];
  const cases = inputs.cases ?? [];
  const caseName = (c: LooseCase) => `case "${c.name}"`;

  if (ctx.siteLinked) {
    if (data.earthFaultKa !== null) {
      const levelA = data.earthFaultKa * 1000;
      cases.forEach((c, i) => {
        if (inputs.kind === 'bonding' && c.kind === 'earth-fault' && c.earthFault && c.earthFault.currentA < levelA)
          reasons.push({ kind: 'earth-fault', path: `cases.${i}.earthFault.currentA`, before: c.earthFault.currentA, after: levelA, sentence: `The earth-fault current of ${caseName(c)} is ${kA(c.earthFault.currentA)}; the site's earth-fault level is now ${kA(levelA)}.` });
        if (inputs.kind === 'exposure' && c.kind === 'fault')
          (c.currents ?? []).forEach((k, j) => {
            if (k.currentA < levelA) reasons.push({ kind: 'earth-fault', path: `cases.${i}.currents.${j}.currentA`, before: k.currentA, after: levelA, sentence: `The fault current of ${caseName(c)} is ${kA(k.currentA)}; the site's earth-fault level is now ${kA(levelA)}.` });
          });
      });
    }
    if (data.threePhaseFaultKa !== null && inputs.kind === 'bonding') {
      const levelA = data.threePhaseFaultKa * 1000;
      cases.forEach((c, i) => {
        if (c.kind !== 'three-phase-fault') return;
        (c.currents ?? []).forEach((k, j) => {
          if (k.currentA < levelA) reasons.push({ kind: 'three-phase-fault', path: `cases.${i}.currents.${j}.currentA`, before: k.currentA, after: levelA, sentence: `The three-phase fault current of ${caseName(c)} is ${kA(k.currentA)}; the site's three-phase fault level is now ${kA(levelA)}.` });
        });
      });
    }
    if (data.clearanceTimeS !== null) {
      const clearanceS = data.clearanceTimeS;
      cases.forEach((c, i) => {
        if (FAULT_KINDS.has(c.kind) && c.durationS !== undefined && c.durationS < clearanceS)
          reasons.push({ kind: 'clearance', path: `cases.${i}.durationS`, before: c.durationS, after: clearanceS, sentence: `The fault duration of ${caseName(c)} is ${formatNumber(c.durationS)} s; faults at the site now take ${formatNumber(clearanceS)} s to clear.` });
      });
    }
    if (data.gridResistanceOhm !== null && inputs.kind === 'bonding' && inputs.earthing) {
      const newOhm = data.gridResistanceOhm;
      const ends = ctx.siteEnd ? [ctx.siteEnd] : (['start', 'end'] as const);
      for (const end of ends) {
        const key = end === 'start' ? 'routeStartOhm' : 'routeEndOhm';
        const ohm = inputs.earthing[key];
        if (ohm < newOhm) reasons.push({ kind: 'grid-resistance', path: `earthing.${key}`, before: ohm, after: newOhm, sentence: `The station grid at the route ${end} is taken as ${formatNumber(ohm)} Ω; the site's grid resistance is now ${formatNumber(newOhm)} Ω.` });
      }
    }
  }

  if (inputs.kind === 'bonding') {
    for (const load of ctx.circuitLoads) {
      const circuitId = load.studyCircuitId ?? (inputs.circuits?.length === 1 ? inputs.circuits[0].id : null);
      if (!circuitId) continue;
      cases.forEach((c, i) => {
        if (c.kind !== 'normal') return;
        (c.currents ?? []).forEach((k, j) => {
          if (k.circuitId === circuitId && k.currentA < load.maxLoadA)
            reasons.push({ kind: 'load', path: `cases.${i}.currents.${j}.currentA`, before: k.currentA, after: load.maxLoadA, sentence: `The load of circuit ${circuitId} in ${caseName(c)} is ${formatNumber(k.currentA)} A; circuit ${load.assetCode} may now carry ${formatNumber(load.maxLoadA)} A.` });
        });
      });
    }
  }
  return reasons;
}

/** The study's inputs with the confirmed reasons' new values written in (a copy). */
export function applyReasons(raw: unknown, reasons: ReviewReason[]): unknown {
  const copy = structuredClone(raw) as Record<string, unknown>;
  for (const r of reasons) {
    const keys = r.path.split('.');
    let node: Record<string, unknown> = copy;
    for (const k of keys.slice(0, -1)) node = node[k] as Record<string, unknown>;
    node[keys[keys.length - 1]] = r.after;
  }
  return copy;
}

/** The value at a dotted inputs path, or undefined. */
export function valueAt(raw: unknown, path: string): unknown {
  let node: unknown = raw;
  for (const k of path.split('.')) node = node && typeof node === 'object' ? (node as Record<string, unknown>)[k] : undefined;
  return node;
}
