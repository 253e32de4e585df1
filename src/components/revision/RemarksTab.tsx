import { useState } from 'react';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { Button, Empty, ErrorNote, formatDate } from '../ui/parts';
import { useRevisionAction } from './use-revision-action';

export default function RemarksTab({ detail, canWrite }: { detail: RevisionDetail; canWrite: boolean }) {
  const r = detail.revision;
  const [body, setBody] = useState('');
  const [itemKey, setItemKey] = useState('');
  const add = useRevisionAction(r.id, () => ({ path: `/api/revisions/${r.id}/remarks`, method: 'POST', body: { body, ...(itemKey ? { itemKey } : {}) } }));
  const resolve = useRevisionAction(r.id, (v: { id: string; resolved: boolean }) => ({ path: `/api/remarks/${v.id}`, method: 'PATCH', body: { resolved: v.resolved } }));
  return (
    <div className="space-y-3">
      {detail.remarks.length === 0 ? <Empty>No remarks yet.</Empty> : (
        <ul className="space-y-2" data-testid="remarks">
          {detail.remarks.map((m) => (
            <li key={m.id} className={`rounded border px-3 py-2 ${m.resolved ? 'border-rule bg-paper' : 'border-copper bg-panel'}`}>
              <div className="text-xs text-ink-soft">{m.authorName}, {formatDate(m.createdAt)}{m.itemKey ? ` on ${m.itemKey}` : ''}{m.resolved ? ', resolved' : ''}</div>
              <p>{m.body}</p>
              {canWrite && <Button tone="plain" onClick={() => resolve.mutate({ id: m.id, resolved: !m.resolved })}>{m.resolved ? 'Reopen' : 'Mark resolved'}</Button>}
            </li>
          ))}
        </ul>
      )}
      {canWrite && (
        <form className="space-y-2 rounded border border-rule bg-panel p-3" onSubmit={(e) => { e.preventDefault(); add.mutate(undefined, { onSuccess: () => setBody('') }); }}>
          <label className="block text-sm font-semibold">New remark<textarea aria-label="New remark" className="mt-1 w-full rounded border border-rule px-2 py-1" rows={3} value={body} onChange={(e) => setBody(e.target.value)} /></label>
          <label className="block text-sm">About checklist item (optional)
            <select aria-label="About item" className="ml-2 rounded border border-rule px-1" value={itemKey} onChange={(e) => setItemKey(e.target.value)}>
              <option value="">the revision in general</option>
              {detail.checklist.map((i) => <option key={i.itemKey} value={i.itemKey}>{i.title.slice(0, 60)} {i.caseId ?? ''}</option>)}
            </select>
          </label>
          <ErrorNote error={add.error ?? resolve.error} />
          <Button type="submit" disabled={add.isPending}>Add remark</Button>
        </form>
      )}
    </div>
  );
}
