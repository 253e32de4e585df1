import { useInfiniteQuery, useQuery } from '@tanstack/react-query';
import { moreQueueQuery, myQueueQuery, type QueueItem, type QueuePage } from '../../lib/queries/me.queries';
import { withQueryClient } from '../ui/with-query-client';
import { Busy, Empty, ErrorNote, StateBadge, formatDate } from '../ui/parts';

function Item({ item }: { item: QueueItem }) {
  return (
    <li className="flex items-center gap-3 px-4 py-2">
      <a className="font-semibold text-copper hover:underline" href={`/revisions/${item.revisionId}`}>
        {item.studyCode} rev {item.revisionNumber}
      </a>
      <span className="truncate">{item.studyTitle}</span>
      <StateBadge state={item.state} />
      {item.overdue && <span className="rounded bg-fail px-2 text-xs font-semibold text-paper">overdue</span>}
      <span className="ml-auto text-xs text-ink-soft">{formatDate(item.updatedAt)}</span>
    </li>
  );
}

/** A queue's total as said: "1,000 or more" past what the server counts. */
const count = (total: number, atLeast: boolean) => `${total.toLocaleString('en-GB')}${atLeast ? ' or more' : ''}`;

/** One queue: its first page, and the next ones when asked for. */
function Queue({ queue }: { queue: QueuePage }) {
  const more = useInfiniteQuery(moreQueueQuery(queue.role, queue.next ?? ''));
  const items = [...queue.items, ...(more.data?.pages.flatMap((p) => p.items) ?? [])];
  const next = more.data ? more.data.pages.at(-1)?.next : queue.next;
  const showMore = () => void (more.data ? more.fetchNextPage() : more.refetch());
  return (
    <div data-testid={`queue-${queue.role}`}>
      <h3 className="bg-paper px-4 py-1 text-sm font-semibold text-ink-soft">{queue.label}</h3>
      <ul className="divide-y divide-rule">{items.map((i) => <Item key={i.revisionId} item={i} />)}</ul>
      {next && (
        <p className="flex items-center gap-3 px-4 py-2 text-sm text-ink-soft">
          <span data-testid="queue-shown">
            {items.length.toLocaleString('en-GB')} of {count(queue.total, queue.totalAtLeast)} shown, those that have waited longest first.
          </span>
          <button type="button" className="rounded border border-rule px-2 py-1 font-semibold text-copper hover:bg-paper disabled:opacity-60" disabled={more.isFetching} onClick={showMore}>
            {more.isFetching ? 'Loading…' : 'Show more'}
          </button>
        </p>
      )}
      {more.error && <ErrorNote error={more.error} />}
    </div>
  );
}

function MyDesk() {
  const { data, isPending, error } = useQuery(myQueueQuery());
  if (isPending) return <Busy label="Loading your queue…" />;
  if (error) return <ErrorNote error={error} />;
  const total = data.waiting.reduce((n, w) => n + w.total, 0);
  const atLeast = data.waiting.some((w) => w.totalAtLeast);
  return (
    <div className="space-y-6">
      <section className="rounded-lg border border-rule bg-panel" aria-labelledby="queue-heading">
        <h2 id="queue-heading" className="border-b border-rule px-4 py-3 text-lg font-semibold">
          Waiting for you <span className="text-ink-soft">({count(total, atLeast)})</span>
        </h2>
        {total === 0 ? (
          <p className="px-4 py-4 text-ink-soft" data-testid="empty-queue">
            Nothing is waiting for you. Calculations submitted to you for checking or approval will appear here.
          </p>
        ) : (
          data.waiting.filter((w) => w.items.length).map((w) => <Queue key={w.role} queue={w} />)
        )}
      </section>
      <section className="rounded-lg border border-rule bg-panel">
        <h2 className="border-b border-rule px-4 py-3 text-lg font-semibold">Recent activity in your projects</h2>
        {data.recent.length ? <ul className="divide-y divide-rule">{data.recent.map((i) => <Item key={i.revisionId} item={i} />)}</ul> : <Empty>No activity yet.</Empty>}
      </section>
    </div>
  );
}

export default withQueryClient(MyDesk);
