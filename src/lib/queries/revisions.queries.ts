import { queryOptions } from '@tanstack/react-query';
import { api } from './api-client';
import type { ChecklistRow, CheckValue, Remark, Revision, Study } from '../db/schema';
import type { StudyResults } from '../calc';
import type { CaseResult } from '../calc/bonding/results';

export interface RevisionDetail {
  revision: Omit<Revision, 'results'> & { results: StudyResults | null };
  study: Study;
  project: { id: string; code: string; name: string };
  checklist: ChecklistRow[];
  remarks: Array<Remark & { authorName: string }>;
  checkValues: CheckValue[];
  signOffs: Array<{ id: string; role: string; name: string; userId: string; statement: string; createdAt: string }>;
}

export const revisionQuery = (revisionId: string) =>
  queryOptions({ queryKey: ['revision', revisionId], queryFn: () => api<RevisionDetail>(`/api/revisions/${revisionId}`) });

/** One case's route profile: the stored results leave it out, and the server recomputes it. */
export const routeProfileQuery = (revisionId: string, caseId: string) =>
  queryOptions({
    queryKey: ['revision', revisionId, 'profile', caseId],
    queryFn: () => api<{ caseId: string; profile: CaseResult['profile']; recomputed: boolean }>(`/api/revisions/${revisionId}/profile?caseId=${encodeURIComponent(caseId)}`),
    // A profile belongs to results that never change once calculated; a new calculation refetches the revision.
    staleTime: Infinity,
  });

export const revisionHistoryQuery = (revisionId: string) =>
  queryOptions({
    queryKey: ['revision', revisionId, 'history'],
    queryFn: () => api<{ events: Array<{ id: number; at: string; type: string; actorName: string; detail: Record<string, unknown>; revisionNumber: number; studyCode: string }> }>(`/api/revisions/${revisionId}/history`),
  });

export const studyQuery = (studyId: string) =>
  queryOptions({
    queryKey: ['study', studyId],
    queryFn: () => api<{ study: Study; project: { id: string; name: string }; revisions: Array<{ id: string; number: number; state: string; updatedAt: string }> }>(`/api/studies/${studyId}`),
  });
