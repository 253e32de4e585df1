import type { BondingStudy } from '../schemas/bonding-study.schema';
import type { CriterionKey, LimitSet } from '../schemas/limit-set.schema';
import type { BondingResults, CaseResult } from './bonding/results';
import type { ExposureResults } from './exposure/solve-exposure';
import type { SheathEndVoltage } from './bonding/results';
import { oversheathVoltage, standingVoltage } from './bonding/worst-values';
import { tolerableVoltages } from './body-tolerance';
import { adiabaticCurrentA } from './adiabatic';
import { jointInWords } from './bonding/joint-names';

export type ChecklistStatus = 'pass' | 'fail' | 'no-limit';

export interface ChecklistItem {
  /** Stable within a revision: criterion and case. */
  id: string;
  criterion: CriterionKey | 'svl-continuous' | 'svl-tov' | 'svl-energy' | 'oversheath-fault' | 'touch-voltage-fault' | 'ecc-thermal' | 'bonding-lead-thermal' | 'rating-loss-factor';
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
    if (c.kind === 'normal') fromSet('standing-voltage-normal', 'Standing voltage at link boxes and open ends to the local earth, normal load', c, worstOverEnds(c, standingVoltage));
    if (c.kind === 'emergency') fromSet('standing-voltage-emergency', 'Standing voltage at link boxes and open ends to the local earth, emergency load', c, worstOverEnds(c, standingVoltage));
    if (c.kind === 'normal' && c.lossFactors.length) {
      fromSet('loss-factor', 'Sheath loss factor against the rating assumption', c, maxOf(c.lossFactors.map((l) => ({ value: l.lossFactor, where: `cable ${l.cable}` }))), '');
    }
    if (isFault) {
      const joints = worstAcrossJoints(c);
      if (joints) fromSet('joint-voltage-fault', 'Voltage across the sectionalising insulation (sheath end to sheath end) during the fault', c, joints);
      if (c.eccCurrents.length) {
        fromSet('ecc-current-fault', 'ECC current during the fault', c, maxOf(c.eccCurrents.map((e) => ({ value: e.maxA, where: `ECC ${e.eccId}` }))), 'A');
      }
      const withstandV = Math.min(...study.cableTypes.map((t) => t.oversheathWithstandKv * 1000));
      items.push(item('oversheath-fault', 'Sheath voltage to the surrounding earth (the larger of to remote and to local earth) against the oversheath withstand', c.caseId, worstOverEnds(c, oversheathVoltage), withstandV, 'V', 'cable type data: oversheath power-frequency withstand'));
    }
    if (isFault && c.durationS !== undefined) {
      items.push(...touchItems(study, c, c.durationS));
      items.push(...thermalItems(study, c, c.durationS));
    }
    if (c.kind === 'normal') items.push(...ratingItems(study, c));
    for (const svl of study.svls.map((_, i) => i)) {
      const stressed = c.svls.filter((s) => s.svlIndex === svl);
      if (!stressed.length) continue;
      const worst = maxOf(stressed.map((s) => ({ value: s.voltageV, where: `SVL at ${jointInWords(study, s.jointIndex)}, cable ${s.cable}, ${s.terminals}` })));
      const spec = study.svls[svl];
      const rated = isFault
        ? item('svl-tov', `SVL ${svl + 1}: voltage during the fault against its temporary-overvoltage capability`, c.caseId, worst, spec.tovRatingV, 'V', "SVL maker's rating entered in the study")
        : item('svl-continuous', `SVL ${svl + 1}: standing voltage against its continuous operating voltage`, c.caseId, worst, spec.continuousRatingV, 'V', "SVL maker's rating entered in the study");
      items.push({ ...rated, id: `${rated.id}:${svl}` });
      const conducting = stressed.filter((s) => s.conducting && s.currentA > 0);
      if (isFault && c.durationS !== undefined && conducting.length) {
        // A conducting SVL modelled as a resistance: voltage and current in phase, E = V·I·t.
        const energy = maxOf(conducting.map((s) => ({ value: (s.voltageV * s.currentA * c.durationS!) / 1000, where: `SVL at ${jointInWords(study, s.jointIndex)}, cable ${s.cable}: ${s.voltageV.toFixed(0)} V × ${s.currentA.toFixed(0)} A × ${c.durationS} s` })));
        const e = item('svl-energy', `SVL ${svl + 1}: energy absorbed while conducting (estimate V·I·t)`, c.caseId, energy, spec.energyRatingKJ ?? null, 'kJ', spec.energyRatingKJ ? "SVL maker's energy rating entered in the study" : 'no energy rating entered for this SVL');
        items.push({ ...e, id: `${e.id}:${svl}` });
      }
    }
  }
  return items;
}

/**
 * Touch voltage at every link box and route end against the IEEE Std 80-2013 tolerable touch
 * voltage (body-current method, §8.3) for the case duration, body weight and surface layer.
 * Without electrode geometry the touch voltage is bounded from above (common practice): at a
 * link box, the rise of its electrode (and enclosure) to remote earth, a person's feet at
 * remote earth; the sheath terminals inside a closed box are not counted. At a station, the
 * sheath voltage to the station grid (a person on the grid touching a sheath end); the grid's
 * own touch voltage belongs to the station design. Soil potential carried from other
 * electrodes (mutual resistance) is not modelled.
 */
function touchItems(study: BondingStudy, c: CaseResult, durationS: number): ChecklistItem[] {
  const tolerable = tolerableVoltages({ soilResistivityOhmM: study.soilResistivityOhmM, surfaceLayer: study.touch.surfaceLayer, durationS, bodyWeightKg: study.touch.bodyWeightKg });
  const candidates = c.points.flatMap((p): Worst[] => {
    if (!p.localEarth) return [];
    if (p.localEarth.kind !== 'station-grid') return [{ value: p.localEarth.voltageV, where: `${p.label}: link-box earth rise to remote earth` }];
    return p.sheathEnds.map((e) => ({ value: e.toLocalEarthV ?? 0, where: `${p.label}: sheath ${e.cable} to the station earth` }));
  });
  if (!candidates.length) return [];
  const surface = study.touch.surfaceLayer ? `surface layer ${study.touch.surfaceLayer.resistivityOhmM} Ω·m, ${study.touch.surfaceLayer.thicknessM} m (Cs ${tolerable.surfaceFactor.toFixed(3)})` : `native soil ${study.soilResistivityOhmM} Ω·m`;
  return [item('touch-voltage-fault', 'Touch voltage at link boxes and route ends (upper bound) against the tolerable touch voltage', c.caseId, maxOf(candidates), tolerable.touchV, 'V', `IEEE Std 80-2013 §8.3 body-current method: ${study.touch.bodyWeightKg} kg, ${durationS} s, ${surface}`)];
}

/** ECCs and bonding leads against their adiabatic rating for the fault duration (IEC 60949 eq. 1; IEEE Std 80-2013 eq. 37). */
function thermalItems(study: BondingStudy, c: CaseResult, durationS: number): ChecklistItem[] {
  const { initialC, finalC } = study.adiabatic;
  const out: ChecklistItem[] = [];
  for (const ecc of study.eccs) {
    const current = c.eccCurrents.find((e) => e.eccId === ecc.id);
    if (!current || ecc.crossSectionMm2 === undefined) continue;
    const limit = adiabaticCurrentA(ecc.material, ecc.crossSectionMm2, durationS, initialC, finalC);
    const x = item('ecc-thermal', `ECC ${ecc.id}: fault current against its adiabatic rating`, c.caseId, { value: current.maxA, where: `ECC ${ecc.id}, ${ecc.crossSectionMm2} mm² ${ecc.material}, ${initialC}→${finalC} °C` }, limit, 'A', `IEC 60949:1988 eq. (1), adiabatic, ${durationS} s`);
    out.push({ ...x, id: `${x.id}:${ecc.id}` });
  }
  if (study.bondingLeads && c.bondingLeadCurrents.length) {
    const leads = study.bondingLeads;
    const limit = adiabaticCurrentA(leads.material, leads.crossSectionMm2, durationS, initialC, finalC);
    out.push(item('bonding-lead-thermal', 'Cross-bonding leads: fault current against their adiabatic rating', c.caseId, maxOf(c.bondingLeadCurrents.map((l) => ({ value: l.maxA, where: `leads at ${jointInWords(study, l.jointIndex)}, ${leads.crossSectionMm2} mm² ${leads.material}` }))), limit, 'A', `IEC 60949:1988 eq. (1), adiabatic, ${durationS} s, ${initialC}→${finalC} °C`));
  }
  return out;
}

/**
 * λ1 against the loss factor the cable's rating assumed. With the dielectric loss and T1
 * neglected, the rating scales as √((1 + λ1,assumed)/(1 + λ1)) (IEC 60287-1-1 eq. 1, from
 * memory): the ratio is given in the "where" so the engineer sees the effect on the rating.
 */
function ratingItems(study: BondingStudy, c: CaseResult): ChecklistItem[] {
  return c.lossFactors.flatMap((l) => {
    const circuit = study.circuits.find((x) => x.id === l.cable.slice(0, -2));
    const type = study.cableTypes.find((t) => t.id === circuit?.cableTypeId);
    if (type?.ratingLossFactor === undefined) return [];
    const ratio = Math.sqrt((1 + type.ratingLossFactor) / (1 + l.lossFactor));
    const x = item('rating-loss-factor', `Cable ${l.cable}: sheath loss factor λ1 against the rating assumption`, c.caseId, { value: l.lossFactor, where: `cable ${l.cable}: rating × ${ratio.toFixed(4)} if λ1 is as calculated` }, type.ratingLossFactor, '', 'IEC 60287-1-1 eq. (1): I ∝ 1/√(1 + λ1), dielectric loss and T1 neglected (approximation)');
    return [{ ...x, id: `${x.id}:${l.cable}` }];
  });
}

/** Checklist items for an exposure study. */
export function evaluateExposureCompliance(results: ExposureResults, limits: LimitSet): ChecklistItem[] {
  const items: ChecklistItem[] = [];
  for (const c of results.cases) {
    const at = { value: c.accessibleV, where: `${c.accessibleAt} of the parallel run, to ${c.reference}` };
    if (c.kind === 'normal') {
      const limit = limits.limits['metalwork-voltage-normal'];
      items.push(item('metalwork-voltage-normal', 'Steady induced voltage on the metalwork', c.caseId, at, limit?.value ?? null, 'V', source(limits, 'metalwork-voltage-normal')));
      if (c.acCurrentDensityAPerM2 !== undefined) {
        const j = limits.limits['ac-current-density'];
        items.push(item('ac-current-density', 'A.c. current density at a coating defect', c.caseId, { value: c.acCurrentDensityAPerM2, where: at.where }, j?.value ?? null, 'A/m²', source(limits, 'ac-current-density')));
      }
    } else {
      const emf = limits.limits['induced-emf-fault'];
      items.push(item('induced-emf-fault', 'Induced EMF during the fault', c.caseId, { value: c.emfV, where: 'along the parallel run, end to end with both ends open' }, emf?.value ?? null, 'V', source(limits, 'induced-emf-fault')));
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

/**
 * The largest sheath-end figure of a case (the first of equals, as maxOf), its place put in
 * words for that end only: a route has thousands of ends, and a sweep evaluates them at every point.
 */
function worstOverEnds(c: CaseResult, figure: (e: SheathEndVoltage) => { value: number; reference: string }): Worst {
  let best: { label: string; cable: string; value: number; reference: string } | undefined;
  for (const p of c.points) {
    for (const e of p.sheathEnds) {
      const f = figure(e);
      if (!best || f.value > best.value) best = { label: p.label, cable: e.cable, value: f.value, reference: f.reference };
    }
  }
  return best ? { value: best.value, where: `${best.label}, sheath ${best.cable} ${best.reference}` } : NO_VALUE;
}

/** The largest voltage across a cut joint's insulation, or undefined where no sheath is cut; worded for the winner only. */
function worstAcrossJoints(c: CaseResult): Worst | undefined {
  let best: { label: string; cable: string; value: number } | undefined;
  for (const p of c.points) for (const a of p.acrossJoint) if (!best || a.voltageV > best.value) best = { label: p.label, cable: a.cable, value: a.voltageV };
  return best && { value: best.value, where: `${best.label}, cable ${best.cable}` };
}

function maxOf(values: Worst[]): Worst {
  return values.reduce((best, v) => (v.value > best.value ? v : best), values[0] ?? NO_VALUE);
}
