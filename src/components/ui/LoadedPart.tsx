import { Component, Suspense, type ErrorInfo, type ReactNode } from 'react';
import { Busy } from './parts';

/**
 * A part of a screen whose code arrives on demand (React.lazy): shows `loadingLabel` while it
 * loads, and a note instead of a blank island if its code cannot be fetched or it fails to draw.
 * Give it a `key` per part so that a failure in one does not stick to the next.
 */
export function LoadedPart({ loadingLabel, children }: { loadingLabel: string; children: ReactNode }) {
  return (
    <PartFailure>
      <Suspense fallback={<Busy label={loadingLabel} />}>{children}</Suspense>
    </PartFailure>
  );
}

class PartFailure extends Component<{ children: ReactNode }, { error: Error | null }> {
  state = { error: null as Error | null };

  static getDerivedStateFromError(error: Error) {
    return { error };
  }

  componentDidCatch(error: Error, info: ErrorInfo) {
    console.error('a part of the page failed', error, info.componentStack);
  }

  render() {
    if (!this.state.error) return this.props.children;
    // A chunk that fails to load stays failed in React.lazy's cache: only a reload fetches it
    // again (after a new release its file name has changed too).
    return (
      <div role="alert" className="rounded border border-fail bg-fail/10 px-3 py-2 text-sm text-fail">
        <p>This part of the page could not be shown. Reload the page to try again; if it keeps failing, tell your administrator.</p>
        <button type="button" className="mt-1 underline" onClick={() => window.location.reload()}>
          Reload the page
        </button>
        <p className="mt-1 text-xs text-ink-soft">Detail: {this.state.error.message}</p>
      </div>
    );
  }
}
