import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api } from './api-client';

export interface StudyRow {
  id: string;
  code: string;
  title: string;
  kind: 'bonding' | 'exposure';
  revisionId: string;
  revisionNumber: number;
  state: string;
  updatedAt: string;
  worstMarginPct: number | null;
  openRemarks: number;
}

export interface StudyListParams {
  /** The `next` of the page before; absent for the first page. */
  after?: string;
  pageSize: number;
  sort: 'code' | 'title' | 'updated';
  direction: 'asc' | 'desc';
  state?: string;
  kind?: string;
  search?: string;
}

export const studiesQuery = (projectId: string, p: StudyListParams) =>
  queryOptions({
    queryKey: ['studies', projectId, p],
    queryFn: () => {
      const q = new URLSearchParams(Object.entries(p).filter(([, v]) => v !== undefined && v !== '').map(([k, v]) => [k, String(v)]));
      return api<{ total: number; rows: StudyRow[]; next: string | null }>(`/api/projects/${projectId}/studies?${q}`);
    },
    placeholderData: keepPreviousData,
  });

export const limitSetsQuery = () =>
  queryOptions({ queryKey: ['limit-sets'], queryFn: () => api<{ limitSets: Array<{ id: string; name: string; latest: { version: number } | null }> }>('/api/limit-sets') });
