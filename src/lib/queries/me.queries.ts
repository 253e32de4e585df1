import { infiniteQueryOptions, queryOptions } from '@tanstack/react-query';
import { api } from './api-client';

export interface QueueItem {
  revisionId: string;
  projectId: string;
  studyCode: string;
  studyTitle: string;
  projectName: string;
  revisionNumber: number;
  state: string;
  updatedAt: string;
  overdue: boolean;
}

/** One page of a queue, longest waiting first: `total` counts them all (at least, when `totalAtLeast`), `next` is the position of the next page. */
export interface QueuePage {
  role: string;
  label: string;
  items: QueueItem[];
  total: number;
  totalAtLeast: boolean;
  next: string | null;
}

export interface MyQueue {
  /** The first page of each of the user's queues. */
  waiting: QueuePage[];
  recent: QueueItem[];
}

export const myQueueQuery = () => queryOptions({ queryKey: ['me', 'queue'], queryFn: () => api<MyQueue>('/api/me/queue') });

/** The pages of a queue after its first (which comes with `myQueueQuery`), fetched only when asked for. */
export const moreQueueQuery = (role: string, after: string) =>
  infiniteQueryOptions({
    queryKey: ['me', 'queue', role, after],
    queryFn: ({ pageParam }) => api<QueuePage>(`/api/me/queue?${new URLSearchParams({ role, after: pageParam })}`),
    initialPageParam: after,
    getNextPageParam: (page) => page.next ?? undefined,
    enabled: false,
  });
