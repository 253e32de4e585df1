import type { BondingStudy } from '../../schemas/bonding-study.schema';
import type { LimitSet } from '../../schemas/limit-set.schema';
import type { BondingResults } from '../bonding/results';
import { checkBondingStudy } from '../bonding/study-checks';
import { evaluateBondingCompliance, type ChecklistItem } from '../compliance';
import { type CalculationScope, calculateBondingStudy } from '../bonding/solve-bonding';
import { CalculationError } from '../errors';

// One study calculated and reduced to what an exploration compares: per checked quantity the
// worst value over all cases and its margin to the limit. Shared by the appraisal, the sweep
// and the placement, so a sweep point equals a single calculation of the same study exactly.

export interface CheckedQuantity {
  /** The checklist criterion (one row per criterion: the worst case and place). */
  criterion: ChecklistItem['criterion'];
  title: string;
  value: number;
  limit: number | null;
  unit: string;
  /** (limit − value)/limit, %; negative when failing; null without a limit. */
  marginPct: number | null;
  caseId: string;
  where: string;
}

export interface StudyFigures {
  quantities: CheckedQuantity[];
  /** Smallest margin over every checked quantity with a limit; null when none has one. */
  worstMarginPct: number | null;
  /** Criteria that fail. */
  failing: string[];
}

export type Evaluation = { ok: true; results: BondingResults; items: ChecklistItem[]; figures: StudyFigures } | { ok: false; error: string };

/** Worst item per criterion: the smallest margin, or the largest value where no limit applies. */
export function reduceChecklist(items: ChecklistItem[]): StudyFigures {
  const byCriterion = new Map<string, ChecklistItem>();
  for (const item of items) {
    const held = byCriterion.get(item.criterion);
    if (!held || worse(item, held)) byCriterion.set(item.criterion, item);
  }
  const quantities = [...byCriterion.values()].map((i) => ({ criterion: i.criterion, title: i.title, value: i.value, limit: i.limit, unit: i.unit, marginPct: i.marginPct, caseId: i.caseId, where: i.where }));
  const margins = quantities.flatMap((q) => (q.marginPct === null ? [] : [q.marginPct]));
  return {
    quantities,
    worstMarginPct: margins.length ? Math.min(...margins) : null,
    failing: quantities.filter((q) => q.marginPct !== null && q.marginPct < 0).map((q) => q.criterion),
  };
}

function worse(a: ChecklistItem, b: ChecklistItem): boolean {
  if (a.marginPct !== null && b.marginPct !== null) return a.marginPct < b.marginPct;
  if (a.marginPct !== null) return true;
  if (b.marginPct !== null) return false;
  return a.value > b.value;
}

/** Checks, calculates and reduces one study; a study the core refuses becomes an error in words, not a throw. */
export function evaluateStudy(study: BondingStudy, limits: LimitSet, scope: CalculationScope = 'full'): Evaluation {
  const issues = checkBondingStudy(study);
  if (issues.length) return { ok: false, error: `${issues[0].path.join('.')}: ${issues[0].message}` };
  try {
    const results = calculateBondingStudy(study, scope);
    const items = evaluateBondingCompliance(study, results, limits);
    return { ok: true, results, items, figures: reduceChecklist(items) };
  } catch (err) {
    if (err instanceof CalculationError) return { ok: false, error: err.message };
    throw err;
  }
}
