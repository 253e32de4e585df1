import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api } from './api-client';
import type { RegisterRow } from '../register/register-query';

export type { RegisterRow };

export interface RegisterParams {
  projectId?: string;
  sort: 'code' | 'name' | 'status' | 'nextDue' | 'margin';
  direction: 'asc' | 'desc';
  status?: string;
  kind?: string;
  search?: string;
  pageSize: number;
  after?: string;
}

const searchOf = (p: object) => new URLSearchParams(Object.entries(p).filter(([, v]) => v !== undefined && v !== '').map(([k, v]) => [k, String(v)]));

export const registerQuery = (p: RegisterParams) =>
  queryOptions({
    queryKey: ['register', p],
    queryFn: () => api<{ total: number; rows: RegisterRow[]; next: string | null }>(`/api/register?${searchOf(p)}`),
    placeholderData: keepPreviousData,
  });

/** The export link for the same filters and sort (every page). */
export const registerCsvHref = (p: Omit<RegisterParams, 'after' | 'pageSize'>) => `/api/register/export?${searchOf(p)}`;

export const registerHistoryQuery = (projectId?: string) =>
  queryOptions({
    queryKey: ['register', 'history', projectId ?? 'all'],
    queryFn: () => api<{ days: Array<{ day: string; status: string; count: number }> }>(`/api/register/history?${searchOf({ projectId })}`),
  });

export interface AssetDetail {
  asset: { id: string; projectId: string; kind: 'circuit' | 'site'; code: string; name: string; route: string; ownerStandard: string; inServiceOn: string | null; siteKind: string | null; removedAt: string | null };
  studies: Array<{ studyId: string; code: string; title: string; state: string | null; revisionNumber: number | null; studyCircuitId: string | null; siteEnd: string | null }>;
  obligations: Array<{ type: { id: string; name: string; intervalMonths: number | null; basis: string; criterion: { quantity: string; unit: string; comparison: string; limit: number } | null }; lastDoneOn: string | null; lastResult: string | null; nextDueOn: string | null }>;
  records: Array<{ id: string; typeName: string; doneOn: string; performedBy: string; values: number[]; result: string; remarks: string; hasEvidence: boolean; evidenceName: string | null; recordedByName: string }>;
  systemData: Array<{ id: string; version: number; source: string; sourceDate: string; data: { threePhaseFaultKa: number | null; earthFaultKa: number | null; clearanceTimeS: number | null; gridResistanceOhm: number | null; maxLoads: Array<{ circuitAssetId: string; maxLoadA: number }> } }>;
}

export const assetQuery = (assetId: string) => queryOptions({ queryKey: ['register', 'asset', assetId], queryFn: () => api<AssetDetail>(`/api/assets/${assetId}`) });

export interface ReviewProposal {
  kind: string;
  sentence: string;
  path: string;
  before: number;
  after: number;
}

export const studyReviewsQuery = (studyId: string) =>
  queryOptions({
    queryKey: ['register', 'reviews', studyId],
    queryFn: () => api<{ reviews: Array<{ id: string; revisionNumber: number; siteCode: string; version: number; source: string; sourceDate: string; reasons: ReviewProposal[] }>; proposals: ReviewProposal[]; editing: { id: string; number: number; version: number } | null }>(`/api/studies/${studyId}/reviews`),
  });

export const projectStudiesQuery = (projectId: string) =>
  queryOptions({
    queryKey: ['studies', projectId, 'all-for-links'],
    queryFn: () => api<{ rows: Array<{ id: string; code: string; title: string }> }>(`/api/projects/${projectId}/studies?pageSize=200&sort=code`),
  });

export const projectAssetsQuery = (projectId: string) =>
  queryOptions({ queryKey: ['register', 'assets', projectId], queryFn: () => api<{ assets: Array<{ id: string; code: string; kind: string; name: string }> }>(`/api/projects/${projectId}/assets`) });

export interface ObligationTypeRow {
  id: string;
  ownerStandard: string;
  name: string;
  appliesTo: string;
  firstDueMonths: number;
  intervalMonths: number | null;
  criterion: { quantity: string; unit: string; comparison: string; limit: number } | null;
  remindDaysBefore: number;
  basis: string;
}

export const obligationTypesQuery = () =>
  queryOptions({ queryKey: ['register', 'obligation-types'], queryFn: () => api<{ obligationTypes: ObligationTypeRow[] }>('/api/admin/obligation-types') });
