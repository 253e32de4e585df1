import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { checkValueSchema } from '../../lib/schemas/check-value.schema';
import { formatDifferencePct, formatQuantity } from '../../lib/format';
import { itemKeyLabel } from '../../lib/compare/labels';
import { Button, Empty, ErrorNote } from '../ui/parts';
import { useRevisionAction } from './use-revision-action';

type Values = z.input<typeof checkValueSchema>;
type CheckValue = RevisionDetail['checkValues'][number];

/**
 * The checker's own figures for chosen results, with the deviation from the computed value.
 * While checking (until the pass), the checker corrects or deletes their own values.
 */
export default function CheckValuesTab({ detail, canAdd }: { detail: RevisionDetail; canAdd: boolean }) {
  const r = detail.revision;
  const add = useRevisionAction(r.id, (v: Values) => ({ path: `/api/revisions/${r.id}/check-values`, method: 'POST', body: v }));
  const change = useRevisionAction(r.id, (v: { id: string; checkerValue: number; explanation?: string }) => ({ path: `/api/revisions/${r.id}/check-values/${v.id}`, method: 'PUT', body: { checkerValue: v.checkerValue, explanation: v.explanation } }));
  const remove = useRevisionAction(r.id, (id: string) => ({ path: `/api/revisions/${r.id}/check-values/${id}`, method: 'DELETE' }));
  const { register, handleSubmit, reset, formState: { errors } } = useForm<Values>({ resolver: zodResolver(checkValueSchema) });
  const items = detail.checklist.filter((i) => i.kind === 'computed' && i.value !== null);
  // canAdd: this person is the revision's checker and it is being checked.
  const own = (v: CheckValue) => canAdd && v.checkerId === r.checkerId;
  return (
    <div className="space-y-3">
      {detail.checkValues.length === 0 ? <Empty>No check values yet.</Empty> : (
        <table className="w-full text-sm" data-testid="check-values">
          <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">Result</th><th className="px-2 py-1">Checker's value</th><th className="px-2 py-1">Computed</th><th className="px-2 py-1">Deviation</th><th className="px-2 py-1">Tolerance</th><th className="px-2 py-1">Explanation</th><th className="px-2 py-1" /></tr></thead>
          <tbody>{detail.checkValues.map((v) => <Row key={v.id} v={v} editable={own(v)} onChange={(x) => change.mutate({ id: v.id, ...x })} onDelete={() => remove.mutate(v.id)} />)}</tbody>
        </table>
      )}
      <ErrorNote error={change.error ?? remove.error} />
      {canAdd && (
        <form noValidate className="grid gap-2 rounded border border-rule bg-panel p-3 sm:grid-cols-3" onSubmit={handleSubmit((v) => add.mutate(v, { onSuccess: () => reset() }))} aria-label="Add a check value">
          {/* Whole titles, grouped by case, across the form's width: two results of one case often differ only at the end. */}
          <label className="text-sm sm:col-span-3">Result<select {...register('itemKey')} className="mt-1 w-full rounded border border-rule px-1">
            {[...new Set(items.map((i) => i.caseId))].map((caseId) => (
              <optgroup key={caseId ?? ''} label={caseId ? `Case ${caseId}` : 'Whole study'}>
                {items.filter((i) => i.caseId === caseId).map((i) => <option key={i.itemKey} value={i.itemKey}>{i.title} (computed {formatQuantity(i.value ?? Number.NaN, i.unit ?? '')})</option>)}
              </optgroup>
            ))}
          </select>{errors.itemKey && <span className="text-fail">{errors.itemKey.message}</span>}</label>
          <label className="text-sm">Your value<input aria-label="Your value" {...register('checkerValue', { valueAsNumber: true })} className="mt-1 w-full rounded border border-rule px-1" />{errors.checkerValue && <span className="text-fail">{errors.checkerValue.message}</span>}</label>
          <label className="text-sm">Explanation (if it deviates)<input {...register('explanation')} className="mt-1 w-full rounded border border-rule px-1" /></label>
          <div className="sm:col-span-3"><ErrorNote error={add.error} /><Button type="submit" disabled={add.isPending}>Record check value</Button></div>
        </form>
      )}
    </div>
  );
}

function Row({ v, editable, onChange, onDelete }: { v: CheckValue; editable: boolean; onChange: (x: { checkerValue: number; explanation?: string }) => void; onDelete: () => void }) {
  const [editing, setEditing] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const [value, setValue] = useState(String(v.checkerValue));
  const [explanation, setExplanation] = useState(v.explanation ?? '');
  const out = Math.abs(v.deviationPct) > v.tolerancePct;
  if (editing) {
    return (
      <tr className="border-t border-rule">
        <td className="px-2 py-1">{itemKeyLabel(v.itemKey)}</td>
        <td className="px-2 py-1"><input aria-label="Corrected value" className="w-24 rounded border border-rule px-1" value={value} onChange={(e) => setValue(e.target.value)} /></td>
        <td className="px-2 py-1 font-mono">{formatQuantity(v.computedValue)}</td>
        <td className="px-2 py-1" colSpan={2} />
        <td className="px-2 py-1"><input aria-label="Corrected explanation" className="w-full rounded border border-rule px-1" value={explanation} onChange={(e) => setExplanation(e.target.value)} /></td>
        <td className="px-2 py-1"><Button onClick={() => { onChange({ checkerValue: Number(value), explanation: explanation || undefined }); setEditing(false); }}>Save</Button> <Button tone="plain" onClick={() => setEditing(false)}>Cancel</Button></td>
      </tr>
    );
  }
  return (
    <tr className="border-t border-rule">
      <td className="px-2 py-1">{itemKeyLabel(v.itemKey)}</td>
      <td className="px-2 py-1 font-mono">{formatQuantity(v.checkerValue)}</td>
      <td className="px-2 py-1 font-mono">{formatQuantity(v.computedValue)}</td>
      <td className={`px-2 py-1 font-mono ${out ? 'text-fail' : 'text-pass'}`}>{formatDifferencePct(v.deviationPct)}</td>
      <td className="px-2 py-1">{v.tolerancePct} %</td>
      <td className="px-2 py-1">{v.explanation ?? (out ? 'needs an explanation' : '')}</td>
      <td className="px-2 py-1 whitespace-nowrap">
        {editable && !confirmDelete && <><Button tone="plain" onClick={() => setEditing(true)}>Edit</Button> <Button tone="plain" onClick={() => setConfirmDelete(true)}>Delete</Button></>}
        {editable && confirmDelete && <><Button tone="danger" onClick={onDelete}>Confirm: delete</Button> <Button tone="plain" onClick={() => setConfirmDelete(false)}>Keep</Button></>}
      </td>
    </tr>
  );
}
