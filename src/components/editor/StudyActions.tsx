import { useState } from 'react';
import { useMutation } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import { withQueryClient } from '../ui/with-query-client';
import { Button, ErrorNote } from '../ui/parts';

type Rev = { id: string; number: number; state: string };

/**
 * On a study's page: copy the study (into this project or another where the person designs), and
 * start the next revision from any issued revision. The server decides; its refusal is shown.
 */
function StudyActions({ studyId, code, title, projectId, revisions, canStart, targets }: { studyId: string; code: string; title: string; projectId: string; revisions: Rev[]; canStart: boolean; targets: Array<{ id: string; code: string; name: string }> }) {
  const issued = revisions.filter((r) => r.state === 'issued' || r.state === 'superseded');
  const latest = revisions[revisions.length - 1];
  const [from, setFrom] = useState(issued[issued.length - 1]?.id ?? '');
  const [copy, setCopy] = useState({ projectId: targets.some((t) => t.id === projectId) ? projectId : targets[0]?.id ?? '', code: `${code}-COPY`, title: `${title} (copy)`, fromRevisionId: latest?.id ?? '' });
  const go = (r: { id: string }) => window.location.assign(`/revisions/${r.id}`);
  const start = useMutation({ mutationFn: () => api<{ id: string }>(`/api/studies/${studyId}/revisions`, { method: 'POST', body: { fromRevisionId: from } }), onSuccess: go });
  const copyIt = useMutation({ mutationFn: () => api<{ revision: { id: string } }>(`/api/studies/${studyId}/copy`, { method: 'POST', body: copy }), onSuccess: (d) => go(d.revision) });
  const input = 'mt-0.5 block rounded border border-rule px-1 py-0.5';
  return (
    <div className="mt-4 grid gap-4 md:grid-cols-2">
      {canStart && issued.length > 0 && (
        <section className="rounded-lg border border-rule bg-panel p-3" aria-label="Start a new revision">
          <h2 className="font-semibold">Start a new revision</h2>
          <label className="block text-xs">From issued revision
            <select aria-label="Start from issued revision" className={input} value={from} onChange={(e) => setFrom(e.target.value)}>
              {issued.map((r) => <option key={r.id} value={r.id}>Revision {r.number}{r.state === 'superseded' ? ' (superseded)' : ''}</option>)}
            </select>
          </label>
          <Button className="mt-2" disabled={!from || start.isPending} onClick={() => start.mutate()}>Start revision {(latest?.number ?? 0) + 1}</Button>
          <ErrorNote error={start.error} />
        </section>
      )}
      {targets.length > 0 && (
        <section className="rounded-lg border border-rule bg-panel p-3" aria-label="Copy this study">
          <h2 className="font-semibold">Copy this study</h2>
          <div className="flex flex-wrap gap-2">
            <label className="block text-xs">Into project
              <select aria-label="Copy into project" className={input} value={copy.projectId} onChange={(e) => setCopy({ ...copy, projectId: e.target.value })}>
                {targets.map((t) => <option key={t.id} value={t.id}>{t.code}: {t.name}</option>)}
              </select>
            </label>
            <label className="block text-xs">From revision
              <select aria-label="Copy from revision" className={input} value={copy.fromRevisionId} onChange={(e) => setCopy({ ...copy, fromRevisionId: e.target.value })}>
                {revisions.map((r) => <option key={r.id} value={r.id}>Revision {r.number}</option>)}
              </select>
            </label>
            <label className="block text-xs">Code of the copy<input aria-label="Code of the copy" className={input} value={copy.code} onChange={(e) => setCopy({ ...copy, code: e.target.value })} /></label>
            <label className="block text-xs">Title of the copy<input aria-label="Title of the copy" className={`${input} w-72`} value={copy.title} onChange={(e) => setCopy({ ...copy, title: e.target.value })} /></label>
          </div>
          <Button className="mt-2" disabled={copyIt.isPending} onClick={() => copyIt.mutate()}>Copy and open the copy</Button>
          <ErrorNote error={copyIt.error} />
        </section>
      )}
    </div>
  );
}

export default withQueryClient(StudyActions);
