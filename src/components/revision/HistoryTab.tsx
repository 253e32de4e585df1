import { useQuery } from '@tanstack/react-query';
import { revisionHistoryQuery } from '../../lib/queries/revisions.queries';
import { Busy, Empty, ErrorNote, formatDate } from '../ui/parts';

export default function HistoryTab({ revisionId }: { revisionId: string }) {
  const { data, isPending, error } = useQuery(revisionHistoryQuery(revisionId));
  if (isPending) return <Busy label="Loading history…" />;
  if (error) return <ErrorNote error={error} />;
  if (!data.events.length) return <Empty>No history yet.</Empty>;
  return (
    <ol className="space-y-1 text-sm" data-testid="history">
      {data.events.map((e) => (
        <li key={e.id} className="border-l-2 border-copper pl-3">
          <span className="font-mono text-xs text-ink-soft">{formatDate(e.at)}</span> <strong>{e.type}</strong> by {e.actorName ?? 'the system'}
          {typeof (e.detail as { reason?: string }).reason === 'string' && <span className="text-ink-soft">: {(e.detail as { reason: string }).reason}</span>}
        </li>
      ))}
    </ol>
  );
}
