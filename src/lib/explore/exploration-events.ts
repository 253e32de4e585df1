import { and, eq } from 'drizzle-orm';
import type { AppServices } from '../services';
import { explorations } from '../db/schema';
import { onExplorationProgress } from './explorations.service';

// Server-sent events for one exploration: its count done pushed as the run reports it, and an
// `end` event when it stops (done, failed or cancelled). A run in this process is heard at once;
// one in another process (a cluster) through its row, read every ROW_CHECK_MS. The page falls
// back to polling the row whenever the stream fails.

/** How often the row is read: the status of a run elsewhere, or a cancel made through another process. */
const ROW_CHECK_MS = 1000;
/** Progress events at most this often, ms: a progress bar needs no more. */
const PUSH_MS = 100;
/** A stream ends after this long whatever happens; the page then reads the row. */
const MAX_STREAM_MS = 15 * 60_000;

type Snapshot = { status: string; done: number; total: number };

const frame = (event: string, data: unknown) => `event: ${event}\ndata: ${JSON.stringify(data)}\n\n`;

export function explorationEventStream(s: AppServices, revisionId: string, id: string, signal: AbortSignal): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  let cleanup = () => {};
  return new ReadableStream<Uint8Array>({
    start(controller) {
      let closed = false;
      let last: Snapshot | null = null;
      let lastPush = 0;
      let pending: ReturnType<typeof setTimeout> | null = null;
      const send = (event: string, data: unknown) => {
        if (!closed) controller.enqueue(encoder.encode(frame(event, data)));
      };
      const close = () => {
        if (closed) return;
        closed = true;
        cleanup();
        controller.close();
      };
      const push = (snap: Snapshot) => {
        if (last && last.status === snap.status && last.done === snap.done && last.total === snap.total) return;
        last = snap;
        lastPush = Date.now();
        send('progress', snap);
      };
      const readRow = async () => {
        const [row] = await s.db.select({ status: explorations.status, done: explorations.done, total: explorations.total }).from(explorations).where(and(eq(explorations.id, id), eq(explorations.revisionId, revisionId)));
        if (!row) return close();
        // A finished row's count is its total; while running, the count reported here may be ahead of the row's.
        if (row.status !== 'running') {
          push(row);
          send('end', { status: row.status });
          return close();
        }
        if (!last || row.done > last.done) push(row);
      };
      const check = () => void readRow().catch(() => close());
      const unsubscribe = onExplorationProgress(id, (p) => {
        if (!p) return check();
        // Throttled: the last report within PUSH_MS is sent when the interval ends.
        const snap = { status: 'running', ...p };
        const wait = PUSH_MS - (Date.now() - lastPush);
        if (pending) clearTimeout(pending);
        pending = null;
        if (wait <= 0) push(snap);
        else pending = setTimeout(() => push(snap), wait);
      });
      const timer = setInterval(check, ROW_CHECK_MS);
      const deadline = setTimeout(close, MAX_STREAM_MS);
      const onAbort = () => close();
      signal.addEventListener('abort', onAbort);
      cleanup = () => {
        unsubscribe();
        clearInterval(timer);
        clearTimeout(deadline);
        if (pending) clearTimeout(pending);
        signal.removeEventListener('abort', onAbort);
      };
      // The browser retries a dropped stream after this long (the page polls meanwhile).
      controller.enqueue(encoder.encode('retry: 2000\n\n'));
      check();
    },
    cancel() {
      cleanup();
    },
  });
}
