import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { signedInQuery } from '../../lib/workflow/sign-offs.queries';
import { Button, Empty, ErrorNote, formatDate } from '../ui/parts';
import { itemKeyLabel } from '../../lib/compare/labels';
import { useRevisionAction } from './use-revision-action';

type Remark = RevisionDetail['remarks'][number];

const KIND_WORD: Record<string, string> = { query: 'Query', return: 'Returned', remark: 'Remark' };

/**
 * Remark threads: whoever raises one (or the checker) closes it; the designer answers with a
 * reply. The revision cannot be passed or issued while a thread is open.
 */
export default function RemarksTab({ detail, canWrite }: { detail: RevisionDetail; canWrite: boolean }) {
  const r = detail.revision;
  const me = useQuery(signedInQuery()).data;
  const [body, setBody] = useState('');
  const [itemKey, setItemKey] = useState('');
  const add = useRevisionAction(r.id, (v: { body: string; parentId?: string }) => ({ path: `/api/revisions/${r.id}/remarks`, method: 'POST', body: { body: v.body, ...(v.parentId ? { parentId: v.parentId } : itemKey ? { itemKey } : {}) } }));
  const resolve = useRevisionAction(r.id, (v: { id: string; resolved: boolean }) => ({ path: `/api/remarks/${v.id}`, method: 'PATCH', body: { resolved: v.resolved } }));
  const threads = detail.remarks.filter((m) => !m.parentId);
  const replies = (id: string) => detail.remarks.filter((m) => m.parentId === id);
  const isApprover = !!me && (me.projectRoles[detail.project.id] ?? []).includes('approver') && me.id !== r.designerId && me.id !== r.checkerId;
  const mayClose = (t: Remark) => !!me && (t.authorId === me.id || (r.checkerId === me.id && r.state !== 'checked') || (r.state === 'checked' && isApprover));
  const mayOpen = r.state !== 'checked' || isApprover;
  const itemLabelFor = (key: string) => {
    const item = detail.checklist.find((i) => i.itemKey === key);
    return item ? `${item.title}${item.caseId ? `, case ${item.caseId}` : ''}` : itemKeyLabel(key);
  };
  return (
    <div className="space-y-3">
      {threads.length === 0 ? <Empty>No remarks yet.</Empty> : (
        <ul className="space-y-2" data-testid="remarks">
          {threads.map((t) => (
            <li key={t.id} className={`rounded border px-3 py-2 ${t.resolved ? 'border-rule bg-paper' : 'border-copper bg-panel'}`} data-testid="remark-thread" data-open={!t.resolved}>
              <div className="text-xs text-ink-soft">{KIND_WORD[t.kind] ?? 'Remark'} by {t.authorName}, {formatDate(t.createdAt)}{t.itemKey ? ` on ${itemLabelFor(t.itemKey)}` : ''}: <strong>{t.resolved ? 'closed' : 'open'}</strong></div>
              <p>{t.body}</p>
              {replies(t.id).map((m) => (
                <div key={m.id} className="ml-4 mt-1 border-l-2 border-rule pl-2" data-testid="remark-reply">
                  <div className="text-xs text-ink-soft">{m.authorName}, {formatDate(m.createdAt)}</div>
                  <p>{m.body}</p>
                </div>
              ))}
              {canWrite && <ThreadActions thread={t} mayClose={mayClose(t)} onReply={(text) => add.mutateAsync({ body: text, parentId: t.id })} onResolve={(resolved) => resolve.mutate({ id: t.id, resolved })} />}
            </li>
          ))}
        </ul>
      )}
      <ErrorNote error={add.error ?? resolve.error} />
      {canWrite && mayOpen && (
        <form className="space-y-2 rounded border border-rule bg-panel p-3" onSubmit={(e) => { e.preventDefault(); add.mutate({ body }, { onSuccess: () => setBody('') }); }}>
          <label className="block text-sm font-semibold">New remark<textarea aria-label="New remark" className="mt-1 w-full rounded border border-rule px-2 py-1" rows={3} value={body} onChange={(e) => setBody(e.target.value)} /></label>
          <label className="block text-sm">About checklist item (optional)
            <select aria-label="About item" className="ml-2 rounded border border-rule px-1" value={itemKey} onChange={(e) => setItemKey(e.target.value)}>
              <option value="">the revision in general</option>
              {detail.checklist.map((i) => <option key={i.itemKey} value={i.itemKey}>{i.title.slice(0, 60)} {i.caseId ?? ''}</option>)}
            </select>
          </label>
          <Button type="submit" disabled={add.isPending}>Add remark</Button>
        </form>
      )}
    </div>
  );
}

function ThreadActions({ thread, mayClose, onReply, onResolve }: { thread: Remark; mayClose: boolean; onReply: (text: string) => Promise<unknown>; onResolve: (resolved: boolean) => void }) {
  const [reply, setReply] = useState('');
  return (
    <div className="mt-2 flex flex-wrap items-end gap-2">
      {!thread.resolved && (
        <>
          <textarea aria-label="Reply" placeholder="your answer" className="w-80 rounded border border-rule px-2 py-1 text-sm" rows={2} value={reply} onChange={(e) => setReply(e.target.value)} />
          <Button tone="plain" onClick={() => onReply(reply).then(() => setReply(''), () => undefined)} disabled={!reply.trim()}>Reply</Button>
        </>
      )}
      {mayClose && <Button tone="plain" onClick={() => onResolve(!thread.resolved)}>{thread.resolved ? 'Reopen thread' : 'Close thread'}</Button>}
    </div>
  );
}
