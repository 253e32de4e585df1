import { useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { type RevisionFacts, type UserEvent, type WorkflowRole, revisionSnapshot } from '../../lib/workflow/revision.machine';
import { Button, ErrorNote } from '../ui/parts';

// The island asks the shared machine which steps the person could take; the server checks the
// facts (results current, checklist complete …) and has the last word.
const ASSUME_READY: RevisionFacts = { resultsCurrent: true, computedEvaluated: true, manualAnswered: true, checkValuesSettled: true, failuresJustified: true, reasonGiven: true };

const STEPS: Array<{ step: 'submit' | 'startCheck' | 'pass' | 'return' | 'issue' | 'withdraw'; label: string; needsReason?: boolean; statement?: boolean; tone?: 'danger' | 'plain' }> = [
  { step: 'submit', label: 'Submit for check', statement: true },
  { step: 'startCheck', label: 'Take for checking' },
  { step: 'pass', label: 'Pass the check', statement: true },
  { step: 'issue', label: 'Approve and issue', statement: true },
  { step: 'return', label: 'Return to designer', needsReason: true, tone: 'danger' },
  { step: 'withdraw', label: 'Withdraw', tone: 'plain' },
];

export default function WorkflowBar({ detail, userId, roles }: { detail: RevisionDetail; userId: string; roles: WorkflowRole[] }) {
  const queryClient = useQueryClient();
  const [open, setOpen] = useState<(typeof STEPS)[number] | null>(null);
  const [text, setText] = useState('');
  const r = detail.revision;
  const snapshot = revisionSnapshot(r.state, { designerId: r.designerId, checkerId: r.checkerId, approverId: r.approverId });
  const possible = STEPS.filter((s) => snapshot.can({ type: `revision.${s.step}`, actor: { userId, roles }, facts: ASSUME_READY } as UserEvent));

  const act = useMutation({
    mutationFn: (s: (typeof STEPS)[number]) =>
      api(`/api/revisions/${r.id}/steps`, { method: 'POST', body: { step: s.step, version: r.version, ...(s.needsReason ? { reason: text } : {}), ...(s.statement && text ? { statement: text } : {}) } }),
    onSuccess: () => {
      setOpen(null);
      setText('');
      return queryClient.invalidateQueries({ queryKey: ['revision', r.id] });
    },
  });
  const newRevision = useMutation({
    mutationFn: () => api<{ id: string }>(`/api/studies/${detail.study.id}/revisions`, { method: 'POST' }),
    onSuccess: (next) => window.location.assign(`/revisions/${next.id}`),
  });
  const canStartNew = roles.includes('designer') && ['issued', 'withdrawn', 'superseded'].includes(r.state);

  if (!possible.length && !canStartNew) return <p className="text-sm text-ink-soft" data-testid="no-steps">No step is yours to take on this revision now.</p>;
  return (
    <div className="space-y-2" data-testid="workflow-bar">
      <div className="flex flex-wrap gap-2">
        {possible.map((s) => (
          <Button key={s.step} tone={s.tone ?? 'primary'} onClick={() => (s.needsReason || s.statement ? setOpen(s) : act.mutate(s))} disabled={act.isPending}>
            {s.label}
          </Button>
        ))}
        {canStartNew && <Button tone="plain" onClick={() => newRevision.mutate()} disabled={newRevision.isPending}>Start a new revision</Button>}
      </div>
      {open && (
        <div className="rounded border border-rule bg-panel p-3">
          <label className="block text-sm font-semibold">
            {open.needsReason ? 'Why does it go back? (kept as a remark)' : 'Your sign-off statement (leave empty for the standard wording)'}
            <textarea aria-label={open.needsReason ? 'Reason' : 'Sign-off statement'} className="mt-1 w-full rounded border border-rule px-2 py-1" rows={3} value={text} onChange={(e) => setText(e.target.value)} />
          </label>
          <div className="mt-2 flex gap-2">
            <Button onClick={() => act.mutate(open)} disabled={act.isPending}>{act.isPending ? 'Working…' : `Confirm: ${open.label.toLowerCase()}`}</Button>
            <Button tone="plain" onClick={() => setOpen(null)}>Cancel</Button>
          </div>
        </div>
      )}
      <ErrorNote error={act.error ?? newRevision.error} />
    </div>
  );
}
