import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import { studyReviewsQuery, type ReviewProposal } from '../../lib/queries/register.queries';
import { formatNumber } from '../../lib/format';
import { withQueryClient } from '../ui/with-query-client';
import { Button, Caution, ErrorNote } from '../ui/parts';

/**
 * On a study under review: why new system data put its issued revision in question, and, for
 * the designer, a new revision pre-filled with the new values, each confirmed one by one.
 */
function StudyReviewBanner({ studyId, isDesigner }: { studyId: string; isDesigner: boolean }) {
  const client = useQueryClient();
  const { data, error } = useQuery(studyReviewsQuery(studyId));
  const [begun, setStarted] = useState<{ revision: { id: string; number: number; version: number }; proposals: ReviewProposal[] } | null>(null);
  // A revision started earlier (another visit) is picked up where it was left.
  const started = begun ?? (data?.editing ? { revision: data.editing, proposals: data.proposals } : null);
  const [confirmed, setConfirmed] = useState<Set<string>>(new Set());
  const start = useMutation({
    mutationFn: () => api<NonNullable<typeof started>>(`/api/studies/${studyId}/reviews`, { method: 'POST' }),
    onSuccess: (r) => setStarted(r),
  });
  const apply = useMutation({
    mutationFn: () => api<{ id: string }>(`/api/studies/${studyId}/reviews/apply`, { method: 'POST', body: { revisionId: started!.revision.id, version: started!.revision.version, accept: [...confirmed] } }),
    onSuccess: (r) => {
      void client.invalidateQueries({ queryKey: ['register'] });
      window.location.assign(`/revisions/${r.id}`);
    },
  });
  if (error) return <ErrorNote error={error} />;
  if (!data || data.reviews.length === 0) return null;
  const toggle = (path: string) => setConfirmed((c) => { const n = new Set(c); if (n.has(path)) n.delete(path); else n.add(path); return n; });
  return (
    <section data-testid="needs-review" className="my-4 space-y-3 rounded-lg border-2 border-fail bg-fail/5 p-4">
      <h2 className="text-lg font-bold text-fail">Needs review</h2>
      {data.reviews.map((r) => (
        <div key={r.id} className="text-sm">
          <p className="font-semibold">Revision {r.revisionNumber}: version {r.version} of the system data of {r.siteCode} ({r.source}, {r.sourceDate})</p>
          <ul className="list-disc pl-5">{r.reasons.map((x) => <li key={x.path}>{x.sentence}</li>)}</ul>
        </div>
      ))}
      <Caution />
      {isDesigner && !started && <Button onClick={() => start.mutate()} disabled={start.isPending}>Start a revision with the new values</Button>}
      {start.error && <ErrorNote error={start.error} />}
      {started && (
        <div className="space-y-2 text-sm">
          <p>Revision {started.revision.number} is open for changes. Confirm each new value to write it into the revision's inputs; leave the others for later.</p>
          <ul className="space-y-1">
            {started.proposals.map((p) => (
              <li key={p.path}>
                <label className="flex items-start gap-2">
                  <input type="checkbox" aria-label={`Confirm ${p.path}`} checked={confirmed.has(p.path)} onChange={() => toggle(p.path)} />
                  <span>{p.sentence} <span className="text-ink-soft">({formatNumber(p.before)} → {formatNumber(p.after)})</span></span>
                </label>
              </li>
            ))}
          </ul>
          <div className="flex gap-3">
            <Button onClick={() => apply.mutate()} disabled={confirmed.size === 0 || apply.isPending}>Write the confirmed values</Button>
            <a className="self-center text-copper hover:underline" href={`/revisions/${started.revision.id}`}>Open the revision without them</a>
          </div>
          {apply.error && <ErrorNote error={apply.error} />}
        </div>
      )}
    </section>
  );
}

export default withQueryClient(StudyReviewBanner);
