import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/queries/api-client';
import { revisionQuery, studyQuery } from '../../../lib/queries/revisions.queries';
import type { RevisionComparison } from '../../../lib/compare/compare.service';
import { formatQuantity } from '../../../lib/format';
import { STATE_LABEL } from '../../ui/states';
import { Busy, ErrorNote } from '../../ui/parts';

/** This revision beside another of its study: by default the last issued one. */
export default function ComparePanel({ revisionId }: { revisionId: string }) {
  const detail = useQuery(revisionQuery(revisionId));
  const studyId = detail.data?.study.id;
  const study = useQuery({ ...studyQuery(studyId ?? ''), enabled: !!studyId });
  const [against, setAgainst] = useState('last-issued');
  const cmp = useQuery({
    queryKey: ['revision', revisionId, 'compare', against],
    queryFn: () => api<RevisionComparison>(`/api/revisions/${revisionId}/compare?against=${encodeURIComponent(against)}`),
  });
  const others = (study.data?.revisions ?? []).filter((r) => r.id !== revisionId);
  return (
    <section className="space-y-2 rounded border border-rule bg-panel p-3 text-sm" data-testid="compare">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="font-semibold">{against === 'last-issued' ? 'Changed since the last issued revision' : 'Compared with'}</h3>
        <label className="ml-auto">Compare with
          <select aria-label="Compare with" className="ml-1 rounded border border-rule bg-panel px-1 py-0.5" value={against} onChange={(e) => setAgainst(e.target.value)}>
            <option value="last-issued">the last issued revision</option>
            <option value="previous">the revision before</option>
            {others.map((r) => <option key={r.id} value={r.id}>revision {r.number} ({STATE_LABEL[r.state] ?? r.state})</option>)}
          </select>
        </label>
      </div>
      {cmp.isPending ? <Busy label="Comparing…" /> : cmp.error ? <ErrorNote error={cmp.error} /> : <ComparisonView c={cmp.data} />}
    </section>
  );
}

function ComparisonView({ c }: { c: RevisionComparison }) {
  if (!c.from) return <p className="text-ink-soft">There is no earlier revision of this kind to compare with.</p>;
  return (
    <div className="space-y-2">
      <p className="text-ink-soft">Revision {c.from.number} ({STATE_LABEL[c.from.state] ?? c.from.state}) → revision {c.to.number} ({STATE_LABEL[c.to.state] ?? c.to.state})</p>
      <div>
        <h4 className="font-semibold">Inputs</h4>
        {c.inputChanges.length ? <ul className="list-disc pl-5" data-testid="input-changes">{c.inputChanges.map((t) => <li key={t}>{t}</li>)}</ul> : <p className="text-ink-soft">No input changed.</p>}
      </div>
      {!c.resultsCompared ? (
        <p className="text-ink-soft">Results are compared once both revisions are calculated.</p>
      ) : (
        <>
          <table className="w-full" data-testid="worst-changes">
            <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">Worst value</th><th className="px-2 py-1">Revision {c.from.number}</th><th className="px-2 py-1">Revision {c.to.number}</th><th className="px-2 py-1">Change</th></tr></thead>
            <tbody>
              {c.worstChanges.map((w) => (
                <tr key={w.quantity} className="border-t border-rule">
                  <td className="px-2 py-1">{w.label}</td>
                  <td className="px-2 py-1 font-mono">{w.before === null ? '—' : formatQuantity(w.before, w.unit)}</td>
                  <td className="px-2 py-1 font-mono">{w.after === null ? '—' : formatQuantity(w.after, w.unit)}</td>
                  <td className="px-2 py-1 font-mono">{w.changePct === null ? '—' : `${w.changePct >= 0 ? '+' : '−'}${Math.abs(Math.round(w.changePct))} %`}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <div>
            <h4 className="font-semibold">Verdicts</h4>
            {c.verdictChanges.length ? <ul className="list-disc pl-5" data-testid="verdict-changes">{c.verdictChanges.map((v) => <li key={v.itemKey}>{v.text}</li>)}</ul> : <p className="text-ink-soft">No verdict changed.</p>}
          </div>
        </>
      )}
    </div>
  );
}
