import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import { projectStudiesQuery } from '../../lib/queries/register.queries';
import { Button, ErrorNote } from '../ui/parts';

/** Records that a study of the project covers this asset (with the circuit in the study, or the route end of a site). */
export default function StudyLinkForm({ asset }: { asset: { id: string; projectId: string; kind: 'circuit' | 'site' } }) {
  const client = useQueryClient();
  const studies = useQuery(projectStudiesQuery(asset.projectId));
  const [studyId, setStudyId] = useState('');
  const [detail, setDetail] = useState('');
  const link = useMutation({
    mutationFn: () => api(`/api/assets/${asset.id}/studies`, { method: 'POST', body: { studyId, ...(detail ? (asset.kind === 'circuit' ? { studyCircuitId: detail } : { siteEnd: detail }) : {}) } }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['register'] }),
  });
  const input = 'ml-2 rounded border border-rule bg-panel px-2 py-1';
  return (
    <div className="mt-2 flex flex-wrap items-end gap-3 text-sm">
      <label>Study
        <select aria-label="Study to link" className={input} value={studyId} onChange={(e) => setStudyId(e.target.value)}>
          <option value="">choose…</option>
          {studies.data?.rows.map((s) => <option key={s.id} value={s.id}>{s.code} {s.title}</option>)}
        </select>
      </label>
      {asset.kind === 'circuit' ? (
        <label>Circuit id in the study<input className={input} value={detail} onChange={(e) => setDetail(e.target.value)} placeholder="e.g. C1" /></label>
      ) : (
        <label>Site at the route
          <select className={input} value={detail} onChange={(e) => setDetail(e.target.value)}><option value="">either end</option><option value="start">start</option><option value="end">end</option></select>
        </label>
      )}
      <Button tone="plain" disabled={!studyId || link.isPending} onClick={() => link.mutate()}>Link the study</Button>
      {link.error && <ErrorNote error={link.error} />}
    </div>
  );
}
