import { queryOptions } from '@tanstack/react-query';
import { api } from './api-client';

export interface QueueItem {
  revisionId: string;
  studyCode: string;
  studyTitle: string;
  projectName: string;
  revisionNumber: number;
  state: string;
  updatedAt: string;
  overdue: boolean;
}

export interface MyQueue {
  waiting: Array<{ role: string; label: string; items: QueueItem[] }>;
  recent: QueueItem[];
}

export const myQueueQuery = () => queryOptions({ queryKey: ['me', 'queue'], queryFn: () => api<MyQueue>('/api/me/queue') });
