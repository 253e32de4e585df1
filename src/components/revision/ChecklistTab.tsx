import { useState } from 'react';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import type { ChecklistRow } from '../../lib/db/schema';
import { formatMarginPct, formatQuantity } from '../../lib/format';
import { Button, Empty, ErrorNote } from '../ui/parts';
import { useRevisionAction } from './use-revision-action';
import { criterionSection, methodCitation, sectionHref } from '../../lib/methods/method-reference';

type Mode = 'answer' | 'verdict' | 'justify' | 'read';
type Save = (body: unknown) => void;

/** The checklist; what a person can do on it depends on their part in this revision. */
export default function ChecklistTab({ detail, userId, roles }: { detail: RevisionDetail; userId: string; roles: string[] }) {
  const r = detail.revision;
  const mode: Mode =
    ['draft', 'returned'].includes(r.state) && r.designerId === userId ? 'answer'
      : r.state === 'in_check' && r.checkerId === userId ? 'verdict'
        : r.state === 'checked' && roles.includes('approver') && userId !== r.designerId && userId !== r.checkerId ? 'justify'
          : 'read';
  const update = useRevisionAction(r.id, (v: { key: string; body: unknown }) => ({ path: `/api/revisions/${r.id}/checklist/${encodeURIComponent(v.key)}`, method: 'PUT', body: v.body }));
  if (!detail.checklist.length) return <Empty>The checklist appears once the revision is calculated.</Empty>;
  const computed = detail.checklist.filter((i) => i.kind === 'computed');
  const manual = detail.checklist.filter((i) => i.kind === 'manual');
  const save = (key: string): Save => (body) => update.mutate({ key, body });
  return (
    <div className="space-y-4">
      {mode === 'answer' && <p className="text-sm text-ink-soft">Before submitting: answer each question the study has not answered itself, and justify each failing item (or change the design).</p>}
      {mode === 'verdict' && <p className="text-sm text-ink-soft">Check worksheet: agree with each item or query it. A query opens a remark thread; the revision cannot pass while a query or remark is open.</p>}
      {mode === 'verdict' && <AgreeRemaining detail={detail} />}
      {mode === 'justify' && <p className="text-sm text-ink-soft">Approval: every failing item needs your justification before the revision can be issued, or return it.</p>}
      <ErrorNote error={update.error} />
      <table className="w-full text-sm" data-testid="checklist">
        <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">Criterion</th><th className="px-2 py-1">Case</th><th className="px-2 py-1">Value</th><th className="px-2 py-1">Limit</th><th className="px-2 py-1">Margin</th><th className="px-2 py-1">Verdict</th><th className="px-2 py-1">Source</th><th className="px-2 py-1">Review</th></tr></thead>
        <tbody>
          {computed.map((i) => (
            <tr key={i.id} className="border-t border-rule align-top" data-testid={`item-${i.itemKey}`}>
              <td className="px-2 py-1">{i.title}<div className="text-xs text-ink-soft">{i.location}</div></td>
              <td className="px-2 py-1">{i.caseId}</td>
              <td className="px-2 py-1 font-mono">{i.value === null ? '—' : formatQuantity(i.value, i.unit)}</td>
              <td className="px-2 py-1 font-mono">{i.limitValue === null ? '—' : formatQuantity(i.limitValue, i.unit)}</td>
              <td className="px-2 py-1 font-mono">{i.marginPct === null ? '—' : formatMarginPct(i.marginPct)}</td>
              <td className={`px-2 py-1 font-semibold ${i.status === 'pass' ? 'text-pass' : i.status === 'fail' ? 'text-fail' : 'text-caution'}`}>{i.status === 'no-limit' ? 'no limit' : i.status.toUpperCase()}</td>
              <td className="px-2 py-1 text-xs">{i.source}<MethodLink itemKey={i.itemKey} engineVersion={r.engineVersion} /></td>
              <td className="px-2 py-1"><Review item={i} mode={mode} onSave={save(i.itemKey)} /></td>
            </tr>
          ))}
        </tbody>
      </table>
      <h3 className="font-semibold">Questions answered by people</h3>
      <table className="w-full text-sm" data-testid="manual-items">
        <tbody>
          {manual.map((i) => (
            <tr key={i.id} className="border-t border-rule align-top" data-testid={`item-${i.itemKey}`} data-generated={i.answerGenerated}>
              <td className="px-2 py-1">{i.title}<div className="text-xs text-ink-soft">basis: {i.source}</div></td>
              <td className="px-2 py-1">
                {i.answerGenerated ? <span className="text-ink-soft" data-testid="generated-answer">{i.answerReason}</span>
                  : mode === 'answer' ? <ManualAnswer item={i} onSave={save(i.itemKey)} />
                    : <span>{i.answer === 'not-applicable' ? 'not applicable' : (i.answer ?? 'not answered')}{i.answerReason ? `: ${i.answerReason}` : ''}</span>}
              </td>
              <td className="px-2 py-1"><Review item={i} mode={mode} onSave={save(i.itemKey)} /></td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** "Agree with every remaining item", after a confirmation that says how many items it covers. */
function AgreeRemaining({ detail }: { detail: RevisionDetail }) {
  const r = detail.revision;
  const remaining = detail.checklist.filter((i) => i.checkerVerdict === null);
  const [confirming, setConfirming] = useState(false);
  const agree = useRevisionAction(r.id, (count: number) => ({ path: `/api/revisions/${r.id}/checklist`, method: 'POST', body: { verdict: 'agree', count } }));
  if (!remaining.length && !agree.error) return null;
  return (
    <div className="rounded border border-rule bg-panel p-2 text-sm">
      {!confirming ? (
        <Button tone="plain" onClick={() => setConfirming(true)} disabled={!remaining.length}>Agree with every remaining item</Button>
      ) : (
        <div className="space-y-2" role="group" aria-label="Confirm agreeing">
          <p data-testid="agree-remaining-count">This records “agree” on {remaining.length} item{remaining.length === 1 ? '' : 's'} that have no verdict yet ({remaining.filter((i) => i.kind === 'computed').length} computed, {remaining.filter((i) => i.kind === 'manual').length} answered by people). Items you queried keep their query.</p>
          <div className="flex gap-2">
            <Button onClick={() => agree.mutate(remaining.length, { onSuccess: () => setConfirming(false) })} disabled={agree.isPending}>{`Confirm: agree with ${remaining.length} item${remaining.length === 1 ? '' : 's'}`}</Button>
            <Button tone="plain" onClick={() => setConfirming(false)}>Cancel</Button>
          </div>
        </div>
      )}
      <ErrorNote error={agree.error} />
    </div>
  );
}

function Review({ item, mode, onSave }: { item: ChecklistRow; mode: Mode; onSave: Save }) {
  const [text, setText] = useState('');
  const [querying, setQuerying] = useState(false);
  const designerNote = item.designerJustification ? <div className="text-xs"><strong>designer’s justification:</strong> {item.designerJustification}</div> : null;
  if (mode === 'verdict') {
    return (
      <div className="space-y-1">
        {designerNote}
        <div className="flex gap-1">
          <Button tone={item.checkerVerdict === 'agree' ? 'primary' : 'plain'} onClick={() => onSave({ verdict: 'agree' })}>Agree</Button>
          <Button tone={item.checkerVerdict === 'query' ? 'danger' : 'plain'} onClick={() => setQuerying(true)}>Query</Button>
        </div>
        {item.checkerVerdict === 'query' && <div className="text-xs text-fail">queried: see Remarks</div>}
        {querying && (
          <div className="space-y-1">
            <textarea aria-label={`Query on ${item.itemKey}`} className="w-56 rounded border border-rule px-1 text-xs" rows={2} value={text} onChange={(e) => setText(e.target.value)} />
            <Button onClick={() => { onSave({ verdict: 'query', remark: text }); setQuerying(false); setText(''); }}>Raise query</Button>
          </div>
        )}
      </div>
    );
  }
  if (mode === 'answer' && item.kind === 'computed' && item.status === 'fail') {
    return (
      <div className="space-y-1">
        {designerNote}
        <textarea aria-label={`Your justification for ${item.itemKey}`} placeholder={item.designerJustification ? 'replace your justification' : 'why is this failing result acceptable?'} className="w-56 rounded border border-rule px-1 text-xs" rows={2} value={text} onChange={(e) => setText(e.target.value)} />
        <Button onClick={() => onSave({ justification: text })}>Record your justification</Button>
      </div>
    );
  }
  const failing = item.status === 'fail' || item.answer === 'no';
  if (mode === 'justify' && failing && !item.justification) {
    return (
      <div className="space-y-1">
        {designerNote}
        <textarea aria-label={`Justification for ${item.itemKey}`} className="w-56 rounded border border-rule px-1 text-xs" rows={2} value={text} onChange={(e) => setText(e.target.value)} />
        <Button onClick={() => onSave({ justification: text })}>Record justification</Button>
      </div>
    );
  }
  return (
    <span className="text-xs">
      {designerNote}
      {item.checkerVerdict ? `checker: ${item.checkerVerdict}` : ''}
      {item.justification ? ` approver’s justification: ${item.justification}` : ''}
    </span>
  );
}

function ManualAnswer({ item, onSave }: { item: ChecklistRow; onSave: Save }) {
  const [reason, setReason] = useState(item.answerReason ?? '');
  return (
    <div className="flex flex-wrap items-center gap-1">
      {(['yes', 'no', 'not-applicable'] as const).map((a) => (
        <Button key={a} tone={item.answer === a ? 'primary' : 'plain'} onClick={() => onSave({ answer: a, reason: reason || undefined })}>
          {a === 'not-applicable' ? 'n/a' : a}
        </Button>
      ))}
      <input aria-label={`Reason for ${item.itemKey}`} placeholder="reason (needed for n/a)" className="w-40 rounded border border-rule px-1 text-xs" value={reason} onChange={(e) => setReason(e.target.value)} />
    </div>
  );
}

/** Where the method statement says how the item's value is computed. */
function MethodLink({ itemKey, engineVersion }: { itemKey: string; engineVersion: string | null }) {
  const section = criterionSection(itemKey);
  if (!section) return null;
  return (
    <div>
      <a className="underline" href={sectionHref(section)} data-testid="method-link" title={methodCitation(section, engineVersion ?? undefined)}>method, section {section}</a>
    </div>
  );
}
