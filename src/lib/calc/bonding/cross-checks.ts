import type { BondingStudy } from '../../schemas/bonding-study.schema';
import {
  crossBondCurrentA,
  flatMutualReactanceOhmPerM,
  sheathReactanceOhmPerM,
  solidBondingFlatLoss,
  solidBondingLoss,
  transposedFlatReactanceOhmPerM,
} from '../closed-form';
import type { BondingNetworkModel } from './network-model';
import type { CaseResult, CrossCheck } from './results';

const PHASES = 'abc';

/**
 * The closed-form method beside the network result, wherever its assumptions hold: one circuit,
 * balanced load, one trefoil or flat layout along the bonding group, no ECC. Earth resistances
 * and ECCs change the network result and not the formula, so a difference there is information,
 * not an error.
 */
export function bondingCrossChecks(study: BondingStudy, model: BondingNetworkModel, cases: CaseResult[]): CrossCheck[] {
  if (study.circuits.length !== 1) return [];
  const circuit = study.circuits[0];
  const type = study.cableTypes.find((t) => t.id === circuit.cableTypeId)!;
  const rs = type.sheathResistanceOhmPerKm / 1000;
  const r = type.conductorResistanceOhmPerKm / 1000;
  const d = type.sheathMeanDiameterMm / 1000;
  const checks: CrossCheck[] = [];

  study.bonding.forEach((group, g) => {
    const segs = model.topology.segments.filter((s) => group.sectionIds.includes(s.sectionId));
    const layouts = new Set(segs.map((s) => s.layout.id));
    if (layouts.size !== 1 || segs.some((s) => s.eccIds.length > 0)) return;
    const placement = segs[0].layout.circuits[0];
    if (placement.formation === 'coordinates') return;
    const rotations = new Set(segs.map((s) => s.phaseRotation));
    const untransposed = rotations.size === 1 && rotations.has(0);
    const x = sheathReactanceOhmPerM(study.frequencyHz, placement.spacingM, d);
    const xm = flatMutualReactanceOhmPerM(study.frequencyHz);
    const groupLength = segs.reduce((s, seg) => s + seg.lengthM, 0);
    const label = `group ${g + 1} (${group.kind}, ${placement.formation})`;

    for (const c of cases) {
      if (c.kind !== 'normal' && c.kind !== 'emergency') continue;
      const current = study.cases.find((sc) => sc.id === c.caseId)!.currents.find((cur) => cur.circuitId === circuit.id)?.currentA ?? 0;
      if (current <= 0) continue;
      const add = (description: string, closedForm: number, network: number, unit: string, method: string) =>
        checks.push({ description: `${label}: ${description}`, caseId: c.caseId, closedForm, network, unit, method, differencePct: ((network - closedForm) / closedForm) * 100 });
      const sheathCurrent = (k: number) => Math.max(...c.sheathCurrents[k].perSegment.filter((p) => group.sectionIds.includes(p.sectionId)).map((p) => p.currentA));
      const groupLoss = (k: number) => (rs * sheathCurrent(k) ** 2) / (r * current ** 2);

      if (group.kind === 'single-point' && untransposed) {
        const emf = placement.formation === 'trefoil' ? [x, x, x] : flatEmfMagnitudes(x, xm);
        const start = segs[0].startM;
        const end = start + groupLength;
        const openEnds = group.earthedAt === 'start' ? [{ at: end, len: groupLength }]
          : group.earthedAt === 'end' ? [{ at: start, len: groupLength }]
            : [{ at: start, len: groupLength / 2 }, { at: end, len: groupLength / 2 }];
        for (const open of openEnds) {
          const point = c.points.find((p) => Math.abs(p.chainageM - open.at) < 1e-6);
          if (!point) continue;
          emf.forEach((e, k) => {
            const side = open.at === start ? 'leaving' : 'arriving';
            const end = point.sheathEnds.find((s) => s.cable === `${circuit.id}-${PHASES[k]}` && s.side === side);
            if (end) add(`open-end voltage, cable ${PHASES[k]}, at ${open.at.toFixed(0)} m`, e * current * open.len, end.voltageV, 'V', 'V = |E|·L (IEC 60287-1-1 §2.3; IEEE 575)');
          });
        }
      }
      if (group.kind === 'solid' && placement.formation === 'trefoil' && untransposed) {
        const closed = solidBondingLoss(rs, r, x, current);
        [0, 1, 2].forEach((k) => {
          add(`sheath current, cable ${PHASES[k]}`, closed.sheathCurrentA, sheathCurrent(k), 'A', 'Is = I·X/√(Rs²+X²) (IEC 60287-1-1 §2.3.1)');
          add(`loss factor, cable ${PHASES[k]}`, closed.lossFactor, groupLoss(k), '', "λ1' = (Rs/R)/(1+(Rs/X)²) (IEC 60287-1-1 §2.3.1)");
        });
      }
      if (group.kind === 'solid' && placement.formation === 'flat' && untransposed) {
        const closed = solidBondingFlatLoss(rs, r, x, xm);
        const byCable = [closed.outerLeading, closed.middle, closed.outerLagging];
        [0, 1, 2].forEach((k) => add(`loss factor, cable ${PHASES[k]}`, byCable[k], groupLoss(k), '', "IEC 60287-1-1 §2.3.2, flat not transposed (P, Q)"));
      }
      if (group.kind === 'solid' && placement.formation === 'flat' && isRegularlyTransposed(segs)) {
        const closed = solidBondingLoss(rs, r, transposedFlatReactanceOhmPerM(study.frequencyHz, placement.spacingM, d), current);
        [0, 1, 2].forEach((k) => add(`loss factor, cable ${PHASES[k]}`, closed.lossFactor, groupLoss(k), '', "λ1' with X1 (IEC 60287-1-1 §2.3.3, regularly transposed)"));
      }
      if (group.kind === 'cross-bonded' && placement.formation === 'trefoil' && untransposed) {
        const [a, b, cc] = group.sectionIds.map((id) => study.sections.find((s) => s.id === id)!.lengthM);
        const closed = crossBondCurrentA(x * current, a, b, cc, rs, x);
        if (closed > 0) {
          [0, 1, 2].forEach((k) => add(`circulating current, path from cable ${PHASES[k]}`, closed, sheathCurrent(k), 'A', 'Is = E·√(a²+b²+c²−ab−bc−ca)/((a+b+c)|Rs+jX|) (CIGRE TB 283)'));
        }
      }
    }
  });
  return checks;
}

/** |E|/I per metre of the three flat cables: outer √(X²+X·Xm+Xm²), middle X. */
function flatEmfMagnitudes(x: number, xm: number): number[] {
  const outer = Math.sqrt(x * x + x * xm + xm * xm);
  return [outer, x, outer];
}

/** Three equal lengths with the cables in each of the three positions once. */
function isRegularlyTransposed(segs: Array<{ lengthM: number; phaseRotation: number }>): boolean {
  const byRotation = [0, 0, 0];
  segs.forEach((s) => (byRotation[s.phaseRotation] += s.lengthM));
  return byRotation.every((l) => Math.abs(l - byRotation[0]) < 1e-6 * byRotation[0]) && byRotation[0] > 0;
}
