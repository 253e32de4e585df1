import { useSyncExternalStore } from 'react';

const never = () => () => {};

/**
 * False in the server's HTML and during hydration, true once React runs the page. A form that
 * carries a secret keeps its button off until then, so a click that comes early cannot fall
 * through to the browser's own submission.
 */
export function useHydrated(): boolean {
  return useSyncExternalStore(never, () => true, () => false);
}
