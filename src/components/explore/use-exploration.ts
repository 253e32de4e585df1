import { useEffect, useRef, useState } from 'react';
import { api } from '../../lib/queries/api-client';

// One exploration job from the page: start, poll its row for the count done, cancel, save.

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

export function useExploration<R>(revisionId: string) {
  const [row, setRow] = useState<ExplorationRow<R> | null>(null);
  const [error, setError] = useState<unknown>(null);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const base = `/api/revisions/${revisionId}/explorations`;

  useEffect(() => () => void (timer.current && clearTimeout(timer.current)), []);

  const poll = (id: string) => {
    timer.current = setTimeout(async () => {
      try {
        const next = await api<ExplorationRow<R>>(`${base}/${id}`);
        setRow(next);
        if (next.status === 'running') poll(id);
      } catch (e) {
        setError(e);
      }
    }, POLL_MS);
  };

  return {
    row,
    error,
    async start(body: unknown) {
      setError(null);
      try {
        const started = await api<ExplorationRow<R>>(base, { method: 'POST', body });
        setRow(started);
        poll(started.id);
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
