import { queryOptions } from '@tanstack/react-query';
import { api } from '../queries/api-client';

export interface SignOffView {
  id: string;
  role: 'designer' | 'checker' | 'approver';
  name: string;
  statement: string;
  inputsHash: string | null;
  resultsHash: string | null;
  createdAt: string;
  valid: boolean;
  voidReason: string | null;
}

/** A revision's sign-offs with their standing; under the revision's key, so every write refreshes it. */
export const signOffsQuery = (revisionId: string) =>
  queryOptions({ queryKey: ['revision', revisionId, 'sign-offs'], queryFn: () => api<{ signOffs: SignOffView[] }>(`/api/revisions/${revisionId}/steps`) });

/** The signed-in person (id and project roles), for islands that decide what to offer. */
export const signedInQuery = () =>
  queryOptions({ queryKey: ['me'], queryFn: () => api<{ id: string; projectRoles: Record<string, string[]> }>('/api/me'), staleTime: 5 * 60_000 });
