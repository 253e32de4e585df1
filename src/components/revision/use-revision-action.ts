import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';

/** A write on a revision's parts that refreshes the revision afterwards. */
export function useRevisionAction<V>(revisionId: string, request: (v: V) => { path: string; method: string; body?: unknown }) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (v: V) => {
      const r = request(v);
      return api(r.path, { method: r.method, body: r.body });
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['revision', revisionId] }),
  });
}
