/**
 * The register's status of an asset, in words. The first that holds wins, most serious first:
 * nothing issued covers it; a covering study was put in question by new system data; an
 * obligation is past due; one falls due within the warning window; else it is covered.
 */
export const registerStatuses = ['no issued study', 'needs review', 'overdue', 'due within 30 days', 'covered'] as const;
export type RegisterStatus = (typeof registerStatuses)[number];

/** Days before a due date that count as "due within 30 days". */
export const DUE_SOON_DAYS = 30;

export interface StatusFacts {
  issuedStudies: number;
  openReviews: number;
  overdue: number;
  dueSoon: number;
}

export function registerStatus(f: StatusFacts): RegisterStatus {
  if (f.issuedStudies === 0) return 'no issued study';
  if (f.openReviews > 0) return 'needs review';
  if (f.overdue > 0) return 'overdue';
  if (f.dueSoon > 0) return 'due within 30 days';
  return 'covered';
}
