import { useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, ApiError } from '../../lib/queries/api-client';
import type { AssetDetail } from '../../lib/queries/register.queries';
import { Button, ErrorNote } from '../ui/parts';

type Link = AssetDetail['studies'][number];

/** One study covering the asset; people who may link studies may also change or remove the link. */
export default function StudyLinkRow({ asset, link, canChange }: { asset: AssetDetail['asset']; link: Link; canChange: boolean }) {
  const client = useQueryClient();
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [detail, setDetail] = useState((asset.kind === 'circuit' ? link.studyCircuitId : link.siteEnd) ?? '');
  const path = `/api/assets/${asset.id}/studies/${link.studyId}`;
  const done = () => {
    setEditing(false);
    setConfirming(false);
    void client.invalidateQueries({ queryKey: ['register'] });
  };
  const change = useMutation({
    mutationFn: () => api(path, { method: 'PATCH', body: asset.kind === 'circuit' ? { studyCircuitId: detail.trim() || null } : { siteEnd: detail || null } }),
    onSuccess: done,
  });
  const unlink = useMutation({ mutationFn: () => api(path, { method: 'DELETE' }), onSuccess: done });
  const input = 'ml-2 rounded border border-rule bg-panel px-2 py-0.5';
  const error = change.error ?? unlink.error;
  return (
    <li data-link={link.code}>
      <a className="font-semibold text-copper hover:underline" href={`/studies/${link.studyId}`}>{link.code}</a> {link.title}
      {link.revisionNumber !== null && <span className="text-ink-soft"> (latest revision {link.revisionNumber}, {link.state?.replace(/_/g, ' ')})</span>}
      {link.studyCircuitId && <span className="text-ink-soft"> · circuit {link.studyCircuitId} in the study</span>}
      {link.siteEnd && <span className="text-ink-soft"> · at the route {link.siteEnd}</span>}
      {canChange && !editing && !confirming && (
        <span className="ml-2 inline-flex gap-2">
          <Button tone="plain" onClick={() => setEditing(true)}>Change the link</Button>
          <Button tone="plain" onClick={() => setConfirming(true)}>Unlink</Button>
        </span>
      )}
      {editing && (
        <span className="ml-2 inline-flex flex-wrap items-center gap-2">
          {asset.kind === 'circuit' ? (
            <label>Circuit id in the study<input aria-label={`Circuit id in ${link.code}`} className={input} value={detail} onChange={(e) => setDetail(e.target.value)} placeholder="e.g. C1" /></label>
          ) : (
            <label>Site at the route
              <select aria-label={`Route end in ${link.code}`} className={input} value={detail} onChange={(e) => setDetail(e.target.value)}><option value="">either end</option><option value="start">start</option><option value="end">end</option></select>
            </label>
          )}
          <Button tone="plain" disabled={change.isPending} onClick={() => change.mutate()}>Save the link</Button>
          <Button tone="plain" onClick={() => setEditing(false)}>Cancel</Button>
        </span>
      )}
      {confirming && (
        <span role="group" aria-label={`Unlink ${link.code}`} className="ml-2 inline-flex flex-wrap items-center gap-2">
          <span>{link.code} will no longer cover {asset.code}.</span>
          <Button tone="danger" disabled={unlink.isPending} onClick={() => unlink.mutate()}>Unlink {link.code}</Button>
          <Button tone="plain" onClick={() => setConfirming(false)}>Keep it</Button>
        </span>
      )}
      {error && (error instanceof ApiError && error.fields.length ? <span className="ml-2 text-xs text-fail">{error.fields.map((f) => f.message).join(' ')}</span> : <ErrorNote error={error} />)}
    </li>
  );
}
