import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { ASSUME_READY, type UserEvent, type WorkflowRole, revisionSnapshot } from '../../lib/workflow/revision.machine';
import { signOffsQuery } from '../../lib/workflow/sign-offs.queries';
import { Button, ErrorNote, formatDate } from '../ui/parts';

// The island asks the shared machine which steps the person could take; the server checks the
// facts (results current, checklist complete, no open remark …) and has the last word.

type StepName = 'submit' | 'startCheck' | 'pass' | 'return' | 'issue' | 'withdraw';
const STEPS: Array<{ step: StepName; label: string; needsReason?: string; signs?: boolean; tone?: 'danger' | 'plain' }> = [
  { step: 'submit', label: 'Submit for check', signs: true },
  { step: 'startCheck', label: 'Take for checking' },
  { step: 'pass', label: 'Pass the check', signs: true },
  { step: 'issue', label: 'Approve and issue', signs: true },
  { step: 'return', label: 'Return to designer', needsReason: 'Why does it go back? (kept as a remark thread for the designer to answer)', tone: 'danger' },
  { step: 'withdraw', label: 'Withdraw', needsReason: 'Why is this revision withdrawn? (kept in its history; a withdrawn revision cannot be revived)', tone: 'plain' },
];

const ROLE_WORD = { designer: 'Designed', checker: 'Checked', approver: 'Approved' } as const;

export default function WorkflowBar({ detail, userId, roles }: { detail: RevisionDetail; userId: string; roles: WorkflowRole[] }) {
  const queryClient = useQueryClient();
  const [open, setOpen] = useState<(typeof STEPS)[number] | null>(null);
  const [text, setText] = useState('');
  const [password, setPassword] = useState('');
  const r = detail.revision;
  const snapshot = revisionSnapshot(r.state, { designerId: r.designerId, checkerId: r.checkerId, approverId: r.approverId });
  const possible = STEPS.filter((s) => snapshot.can({ type: `revision.${s.step}`, actor: { userId, roles }, facts: ASSUME_READY } as UserEvent));

  const act = useMutation({
    mutationFn: (s: (typeof STEPS)[number]) =>
      api(`/api/revisions/${r.id}/steps`, {
        method: 'POST',
        body: { step: s.step, version: r.version, ...(s.needsReason ? { reason: text } : {}), ...(s.signs && text ? { statement: text } : {}), ...(s.signs ? { password } : {}) },
      }),
    onSuccess: () => {
      setOpen(null);
      setText('');
      setPassword('');
      return queryClient.invalidateQueries({ queryKey: ['revision', r.id] });
    },
    // The password is never kept longer than one attempt.
    onError: () => setPassword(''),
  });
  const newRevision = useMutation({
    mutationFn: () => api<{ id: string }>(`/api/studies/${detail.study.id}/revisions`, { method: 'POST' }),
    onSuccess: (next) => window.location.assign(`/revisions/${next.id}`),
  });
  const canStartNew = roles.includes('designer') && ['issued', 'withdrawn', 'superseded'].includes(r.state);
  const choose = (s: (typeof STEPS)[number]) => {
    act.reset();
    setText('');
    setPassword('');
    if (s.needsReason || s.signs) setOpen(s);
    else act.mutate(s);
  };

  return (
    <div className="space-y-2">
      {!possible.length && !canStartNew ? <p className="text-sm text-ink-soft" data-testid="no-steps">No step is yours to take on this revision now.</p> : (
        <div className="space-y-2" data-testid="workflow-bar">
          <div className="flex flex-wrap gap-2">
            {possible.map((s) => (
              <Button key={s.step} tone={s.tone ?? 'primary'} onClick={() => choose(s)} disabled={act.isPending}>
                {s.label}
              </Button>
            ))}
            {canStartNew && <Button tone="plain" onClick={() => newRevision.mutate()} disabled={newRevision.isPending}>Start a new revision</Button>}
          </div>
          {open && (
            <form className="rounded border border-rule bg-panel p-3" onSubmit={(e) => { e.preventDefault(); act.mutate(open); }}>
              <label className="block text-sm font-semibold">
                {open.needsReason ?? 'Your sign-off statement (leave empty for the standard wording)'}
                <textarea aria-label={open.needsReason ? 'Reason' : 'Sign-off statement'} className="mt-1 w-full rounded border border-rule px-2 py-1" rows={3} value={text} onChange={(e) => setText(e.target.value)} />
              </label>
              {open.signs && (
                <label className="mt-2 block text-sm font-semibold">
                  Your password (you sign this step: it records the inputs and results as they are now)
                  <input type="password" autoComplete="current-password" aria-label="Your password" className="mt-1 block w-72 rounded border border-rule px-2 py-1" value={password} onChange={(e) => setPassword(e.target.value)} />
                </label>
              )}
              <div className="mt-2 flex gap-2">
                <Button type="submit" disabled={act.isPending}>{act.isPending ? 'Working…' : `Confirm: ${open.label.toLowerCase()}`}</Button>
                <Button tone="plain" onClick={() => setOpen(null)}>Cancel</Button>
              </div>
            </form>
          )}
          <ErrorNote error={act.error ?? newRevision.error} />
        </div>
      )}
      <SignOffs revisionId={r.id} />
    </div>
  );
}

/** Who signed what; a signature whose inputs or results have changed since is shown void. */
function SignOffs({ revisionId }: { revisionId: string }) {
  const { data } = useQuery(signOffsQuery(revisionId));
  if (!data?.signOffs.length) return null;
  return (
    <ul className="space-y-1 text-xs" data-testid="sign-offs">
      {data.signOffs.map((s) => (
        <li key={s.id} className={s.valid ? 'text-ink-soft' : 'text-fail'} data-valid={s.valid}>
          <span className={s.valid ? '' : 'line-through'}>{ROLE_WORD[s.role]} by {s.name}, {formatDate(s.createdAt)}: “{s.statement}”</span>
          {s.valid ? <span className="font-mono"> inputs {s.inputsHash?.slice(0, 12)}…, results {s.resultsHash?.slice(0, 12)}…</span> : <strong> {s.voidReason}</strong>}
        </li>
      ))}
    </ul>
  );
}
