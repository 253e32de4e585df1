import { useEffect, useState } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';

// One exploration job from the page: start, follow its count done, cancel, save. The row lives
// in the TanStack Query cache; while it runs, the server pushes its progress as server-sent
// events (…/events) into that cache, and the row is polled instead whenever the stream is not
// open (no EventSource, or the stream failed).

export interface ExplorationRow<R = unknown> {
  id: string;
  kind: string;
  status: 'running' | 'done' | 'failed' | 'cancelled';
  done: number;
  total: number;
  result: R | null;
  error: string | null;
  savedAt: string | null;
  inputsHash: string;
  engineVersion: string;
}

const POLL_MS = 300;

export const explorationKey = (revisionId: string, id: string | null) => ['exploration', revisionId, id] as const;

export function useExploration<R>(revisionId: string) {
  const queryClient = useQueryClient();
  const [id, setId] = useState<string | null>(null);
  const [streaming, setStreaming] = useState(false);
  const [error, setError] = useState<unknown>(null);
  const base = `/api/revisions/${revisionId}/explorations`;
  const key = explorationKey(revisionId, id);

  const query = useQuery({
    queryKey: key,
    queryFn: () => api<ExplorationRow<R>>(`${base}/${id}`),
    enabled: id !== null,
    // Polling only while the run goes on and no stream brings its progress.
    refetchInterval: (q) => (q.state.data?.status === 'running' && !streaming ? POLL_MS : false),
  });
  const row = query.data ?? null;
  const running = row?.status === 'running';

  useEffect(() => {
    if (!id || !running || typeof EventSource === 'undefined') return;
    const source = new EventSource(`${base}/${id}/events`);
    setStreaming(true);
    source.addEventListener('progress', (e) => {
      const p = JSON.parse((e as MessageEvent).data) as { status: ExplorationRow['status']; done: number; total: number };
      queryClient.setQueryData<ExplorationRow<R>>(explorationKey(revisionId, id), (old) => old && { ...old, done: p.done, total: p.total });
    });
    source.addEventListener('end', () => {
      source.close();
      setStreaming(false);
      // The finished row (with its result) from its address.
      void queryClient.invalidateQueries({ queryKey: explorationKey(revisionId, id) });
    });
    // A failed stream: close it and poll (EventSource would retry on its own; polling is simpler to reason about).
    source.onerror = () => {
      source.close();
      setStreaming(false);
    };
    return () => {
      source.close();
      setStreaming(false);
    };
  }, [id, running, base, revisionId, queryClient]);

  const setRow = (next: ExplorationRow<R>) => queryClient.setQueryData(explorationKey(revisionId, next.id), next);

  return {
    row,
    error: error ?? query.error,
    /** Whether progress currently arrives by the event stream (else by polling). */
    streaming,
    async start(body: unknown) {
      setError(null);
      try {
        const started = await api<ExplorationRow<R>>(base, { method: 'POST', body });
        setRow(started);
        setId(started.id);
      } catch (e) {
        setError(e);
      }
    },
    async cancel() {
      if (!row) return;
      try {
        await api(`${base}/${row.id}/cancel`, { method: 'POST' });
        setRow({ ...row, status: 'cancelled' });
      } catch (e) {
        setError(e);
      }
    },
    async save() {
      if (!row) return;
      try {
        const saved = await api<{ savedAt: string }>(`${base}/${row.id}/save`, { method: 'POST' });
        setRow({ ...row, savedAt: saved.savedAt });
      } catch (e) {
        setError(e);
      }
    },
  };
}
