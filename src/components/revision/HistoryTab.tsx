import { useQuery } from '@tanstack/react-query';
import { revisionHistoryQuery } from '../../lib/queries/revisions.queries';
import { eventSentence } from '../../lib/records/event-sentences';
import { Busy, Empty, ErrorNote, formatDate } from '../ui/parts';
import ComparePanel from './compare/ComparePanel';

export default function HistoryTab({ revisionId }: { revisionId: string }) {
  const { data, isPending, error } = useQuery(revisionHistoryQuery(revisionId));
  return (
    <div className="space-y-4">
      <ComparePanel revisionId={revisionId} />
      {isPending ? <Busy label="Loading history…" /> : error ? <ErrorNote error={error} /> : !data.events.length ? <Empty>No history yet.</Empty> : (
        <ol className="space-y-1 text-sm" data-testid="history">
          {data.events.map((e) => (
            <li key={e.id} className="border-l-2 border-copper pl-3">
              <span className="font-mono text-xs text-ink-soft">{formatDate(e.at)}</span> {eventSentence(e)}
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
