import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api } from './api-client';

export interface AuditFilters {
  type?: string;
  actorId?: string;
  revisionId?: string;
  from?: string;
  to?: string;
}

export interface AuditRow {
  id: number;
  at: string;
  actorName: string | null;
  type: string;
  revisionId: string | null;
  detail: Record<string, unknown>;
}

export const auditQuery = (filters: AuditFilters, page: number, pageSize: number) =>
  queryOptions({
    queryKey: ['audit', filters, page, pageSize],
    queryFn: () => {
      const q = new URLSearchParams({ page: String(page), pageSize: String(pageSize), ...Object.fromEntries(Object.entries(filters).filter(([, v]) => v)) });
      return api<{ total: number; events: AuditRow[] }>(`/api/audit?${q}`);
    },
    placeholderData: keepPreviousData,
  });

export const auditFacetsQuery = () =>
  queryOptions({ queryKey: ['audit', 'facets'], queryFn: () => api<{ people: Array<{ id: string; name: string }>; types: string[] }>('/api/audit/facets') });
