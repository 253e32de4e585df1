import type { BondingStudy } from '../schemas/bonding-study.schema';
import type { CriterionKey, LimitSet } from '../schemas/limit-set.schema';
import type { BondingResults, CaseResult } from './bonding/results';
import type { ExposureResults } from './exposure/solve-exposure';
import { oversheathVoltages, standingVoltages } from './bonding/worst-values';

export type ChecklistStatus = 'pass' | 'fail' | 'no-limit';

export interface ChecklistItem {
  /** Stable within a revision: criterion and case. */
  id: string;
  criterion: CriterionKey | 'svl-continuous' | 'svl-tov' | 'oversheath-fault' | 'touch-voltage-fault';
  title: string;
  caseId: string;
  where: string;
  value: number;
  limit: number | null;
  unit: string;
  /** (limit − value)/limit in per cent; negative when failing. */
  marginPct: number | null;
  status: ChecklistStatus;
  source: string;
}

interface Worst {
  value: number;
  where: string;
}

const NO_VALUE: Worst = { value: 0, where: '—' };

/** Turns bonding results and a limit set into checklist items, one per criterion and case. */
export function evaluateBondingCompliance(study: BondingStudy, results: BondingResults, limits: LimitSet): ChecklistItem[] {
  const items: ChecklistItem[] = [];
  const fromSet = (criterion: CriterionKey, title: string, c: CaseResult, worst: Worst, unit = 'V') => {
    const limit = limits.limits[criterion];
    items.push(item(criterion, title, c.caseId, worst, limit?.value ?? null, limit?.unit ?? unit, source(limits, criterion)));
  };

  for (const c of results.cases) {
    const isFault = c.kind !== 'normal' && c.kind !== 'emergency';
    // Standing voltage: what a person at the box, or an SVL to earth, sees — sheath to the local earth.
    if (c.kind === 'normal') fromSet('standing-voltage-normal', 'Standing voltage at link boxes and open ends to the local earth, normal load', c, maxOf(standingVoltages(c)));
    if (c.kind === 'emergency') fromSet('standing-voltage-emergency', 'Standing voltage at link boxes and open ends to the local earth, emergency load', c, maxOf(standingVoltages(c)));
    if (c.kind === 'normal' && c.lossFactors.length) {
      fromSet('loss-factor', 'Sheath loss factor against the rating assumption', c, maxOf(c.lossFactors.map((l) => ({ value: l.lossFactor, where: `cable ${l.cable}` }))), '');
    }
    if (isFault) {
      const joints = c.points.flatMap((p) => p.acrossJoint.map((a) => ({ value: a.voltageV, where: `${p.label}, cable ${a.cable}` })));
      if (joints.length) fromSet('joint-voltage-fault', 'Voltage across the sectionalising insulation (sheath end to sheath end) during the fault', c, maxOf(joints));
      if (c.eccCurrents.length) {
        fromSet('ecc-current-fault', 'ECC current during the fault', c, maxOf(c.eccCurrents.map((e) => ({ value: e.maxA, where: `ECC ${e.eccId}` }))), 'A');
      }
      const withstandV = Math.min(...study.cableTypes.map((t) => t.oversheathWithstandKv * 1000));
      items.push(item('oversheath-fault', 'Sheath voltage to the surrounding earth (the larger of to remote and to local earth) against the oversheath withstand', c.caseId, maxOf(oversheathVoltages(c)), withstandV, 'V', 'cable type data: oversheath power-frequency withstand'));
    }
    for (const svl of study.svls.map((_, i) => i)) {
      const stressed = c.svls.filter((s) => s.svlIndex === svl);
      if (!stressed.length) continue;
      const worst = maxOf(stressed.map((s) => ({ value: s.voltageV, where: `SVL at joint ${s.jointIndex}, cable ${s.cable}, ${s.terminals}` })));
      const spec = study.svls[svl];
      const rated = isFault
        ? item('svl-tov', `SVL ${svl + 1}: voltage during the fault against its temporary-overvoltage capability`, c.caseId, worst, spec.tovRatingV, 'V', "SVL maker's rating entered in the study")
        : item('svl-continuous', `SVL ${svl + 1}: standing voltage against its continuous operating voltage`, c.caseId, worst, spec.continuousRatingV, 'V', "SVL maker's rating entered in the study");
      items.push({ ...rated, id: `${rated.id}:${svl}` });
    }
  }
  return items;
}

/** Checklist items for an exposure study. */
export function evaluateExposureCompliance(results: ExposureResults, limits: LimitSet): ChecklistItem[] {
  const items: ChecklistItem[] = [];
  for (const c of results.cases) {
    const at = { value: c.accessibleV, where: 'end of the parallel run' };
    if (c.kind === 'normal') {
      const limit = limits.limits['metalwork-voltage-normal'];
      items.push(item('metalwork-voltage-normal', 'Steady induced voltage on the metalwork', c.caseId, at, limit?.value ?? null, 'V', source(limits, 'metalwork-voltage-normal')));
      if (c.acCurrentDensityAPerM2 !== undefined) {
        const j = limits.limits['ac-current-density'];
        items.push(item('ac-current-density', 'A.c. current density at a coating defect', c.caseId, { value: c.acCurrentDensityAPerM2, where: at.where }, j?.value ?? null, 'A/m²', source(limits, 'ac-current-density')));
      }
    } else {
      const emf = limits.limits['induced-emf-fault'];
      items.push(item('induced-emf-fault', 'Induced EMF during the fault', c.caseId, { value: c.emfV, where: 'along the parallel run' }, emf?.value ?? null, 'V', source(limits, 'induced-emf-fault')));
      if (c.tolerable) {
        items.push(item('touch-voltage-fault', 'Accessible voltage against the tolerable touch voltage', c.caseId, at, c.tolerable.touchV, 'V', `IEEE Std 80-2013 body-current method, ${c.durationS} s`));
      }
    }
  }
  return items;
}

function item(criterion: ChecklistItem['criterion'], title: string, caseId: string, worst: Worst, limit: number | null, unit: string, source: string): ChecklistItem {
  const marginPct = limit === null ? null : ((limit - worst.value) / limit) * 100;
  return {
    id: `${criterion}:${caseId}`,
    criterion,
    title,
    caseId,
    where: worst.where,
    value: worst.value,
    limit,
    unit,
    marginPct,
    status: limit === null ? 'no-limit' : worst.value <= limit ? 'pass' : 'fail',
    source,
  };
}

const source = (limits: LimitSet, key: CriterionKey) => {
  const limit = limits.limits[key];
  return limit ? `${limits.name} v${limits.version}: ${limit.source}` : `no value in ${limits.name}`;
};

function maxOf(values: Worst[]): Worst {
  return values.reduce((best, v) => (v.value > best.value ? v : best), values[0] ?? NO_VALUE);
}
