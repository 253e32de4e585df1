import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

let browserClient: QueryClient | undefined;

/** One client in the browser, shared by every island on the page (a fresh one on the server). */
export function getQueryClient(): QueryClient {
  // A refusal (4xx) will not change on retry; only a server or network failure is retried.
  const retry = (count: number, error: unknown) => count < 1 && !(error instanceof ApiError && error.status < 500);
  const make = () => new QueryClient({ defaultOptions: { queries: { staleTime: 10_000, retry, refetchOnWindowFocus: false } } });
  if (typeof window === 'undefined') return make();
  browserClient ??= make();
  return browserClient;
}
