// The calculation core's public surface. Framework-free: no Astro, React, database, zod or
// Node imports (type-only imports of the input contracts are erased at build time).
import type { BondingStudy } from '../schemas/bonding-study.schema';
import type { ExposureStudy } from '../schemas/exposure-study.schema';
import type { LimitSet } from '../schemas/limit-set.schema';
import { calculateBondingStudy } from './bonding/solve-bonding';
import type { BondingResults } from './bonding/results';
import { type ChecklistItem, evaluateBondingCompliance, evaluateExposureCompliance } from './compliance';
import { type ExposureResults, calculateExposureStudy } from './exposure/solve-exposure';

export { ENGINE_VERSION } from './constants';
export { CalculationError } from './errors';
export type { BondingResults, ExposureResults, ChecklistItem };

export type Study = BondingStudy | ExposureStudy;
export type StudyResults = BondingResults | ExposureResults;

/** Calculates every case of a validated study. Throws CalculationError when the network cannot be solved. */
export function calculateStudy(study: Study): StudyResults {
  return study.kind === 'bonding' ? calculateBondingStudy(study) : calculateExposureStudy(study);
}

/** Checklist items for a study's results against a limit set. */
export function evaluateCompliance(study: Study, results: StudyResults, limits: LimitSet): ChecklistItem[] {
  if (study.kind === 'bonding' && results.kind === 'bonding') return evaluateBondingCompliance(study, results, limits);
  if (study.kind === 'exposure' && results.kind === 'exposure') return evaluateExposureCompliance(results, limits);
  throw new Error('results do not belong to this study');
}
