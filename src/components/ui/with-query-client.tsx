import { QueryClientProvider } from '@tanstack/react-query';
import type { ComponentType } from 'react';
import { getQueryClient } from '../../lib/queries/query-client';

/** Wraps an island so every island on the page shares the browser's one QueryClient. */
export function withQueryClient<P extends object>(Component: ComponentType<P>) {
  return function QueryIsland(props: P) {
    return (
      <QueryClientProvider client={getQueryClient()}>
        <Component {...props} />
      </QueryClientProvider>
    );
  };
}
