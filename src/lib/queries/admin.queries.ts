import { queryOptions } from '@tanstack/react-query';
import { api } from './api-client';

export const usersQuery = () =>
  queryOptions({ queryKey: ['admin', 'users'], queryFn: () => api<{ users: Array<{ id: string; email: string; name: string; isAdmin: boolean; roles: Array<{ role: string; projectCode: string }> }> }>('/api/admin/users') });

export const projectsQuery = () =>
  queryOptions({ queryKey: ['projects'], queryFn: () => api<{ projects: Array<{ id: string; code: string; name: string }> }>('/api/projects') });

export const membersQuery = (projectId: string) =>
  queryOptions({
    queryKey: ['admin', 'members', projectId],
    queryFn: () => api<{ members: Array<{ userId: string; name: string; email: string; role: string }> }>(`/api/admin/projects/${projectId}/members`),
    enabled: !!projectId,
  });

export const limitSetDetailsQuery = () =>
  queryOptions({
    queryKey: ['limit-sets', 'details'],
    queryFn: () => api<{ limitSets: Array<{ id: string; name: string; latest: { version: number; limits: Record<string, { value: number; unit: string; source: string }>; manualItems: unknown[]; checkTolerancePct: number } | null }> }>('/api/limit-sets'),
  });
