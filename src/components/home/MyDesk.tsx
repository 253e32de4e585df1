import { useQuery } from '@tanstack/react-query';
import { myQueueQuery, type QueueItem } from '../../lib/queries/me.queries';
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

function MyDesk() {
  const { data, isPending, error } = useQuery(myQueueQuery());
  if (isPending) return <Busy label="Loading your queue…" />;
  if (error) return <ErrorNote error={error} />;
  const total = data.waiting.reduce((n, w) => n + w.items.length, 0);
  return (
    <div className="space-y-6">
      <section className="rounded-lg border border-rule bg-panel" aria-labelledby="queue-heading">
        <h2 id="queue-heading" className="border-b border-rule px-4 py-3 text-lg font-semibold">
          Waiting for you <span className="text-ink-soft">({total})</span>
        </h2>
        {total === 0 ? (
          <p className="px-4 py-4 text-ink-soft" data-testid="empty-queue">
            Nothing is waiting for you. Calculations submitted to you for checking or approval will appear here.
          </p>
        ) : (
          data.waiting.filter((w) => w.items.length).map((w) => (
            <div key={w.role} data-testid={`queue-${w.role}`}>
              <h3 className="bg-paper px-4 py-1 text-sm font-semibold text-ink-soft">{w.label}</h3>
              <ul className="divide-y divide-rule">{w.items.map((i) => <Item key={i.revisionId} item={i} />)}</ul>
            </div>
          ))
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
