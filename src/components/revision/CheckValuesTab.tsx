import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { checkValueSchema } from '../../lib/schemas/revision-actions.schema';
import { formatQuantity } from '../../lib/format';
import { Button, Empty, ErrorNote } from '../ui/parts';
import { useRevisionAction } from './use-revision-action';

type Values = z.input<typeof checkValueSchema>;

/** The checker's own figures for chosen results, with the deviation from the computed value. */
export default function CheckValuesTab({ detail, canAdd }: { detail: RevisionDetail; canAdd: boolean }) {
  const r = detail.revision;
  const add = useRevisionAction(r.id, (v: Values) => ({ path: `/api/revisions/${r.id}/check-values`, method: 'POST', body: v }));
  const { register, handleSubmit, reset, formState: { errors } } = useForm<Values>({ resolver: zodResolver(checkValueSchema) });
  const items = detail.checklist.filter((i) => i.kind === 'computed' && i.value !== null);
  return (
    <div className="space-y-3">
      {detail.checkValues.length === 0 ? <Empty>No check values yet.</Empty> : (
        <table className="w-full text-sm" data-testid="check-values">
          <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">Result</th><th className="px-2 py-1">Checker's value</th><th className="px-2 py-1">Computed</th><th className="px-2 py-1">Deviation</th><th className="px-2 py-1">Tolerance</th><th className="px-2 py-1">Explanation</th></tr></thead>
          <tbody>{detail.checkValues.map((v) => {
            const out = Math.abs(v.deviationPct) > v.tolerancePct;
            return <tr key={v.id} className="border-t border-rule"><td className="px-2 py-1">{v.itemKey}</td><td className="px-2 py-1 font-mono">{formatQuantity(v.checkerValue)}</td><td className="px-2 py-1 font-mono">{formatQuantity(v.computedValue)}</td><td className={`px-2 py-1 font-mono ${out ? 'text-fail' : 'text-pass'}`}>{v.deviationPct.toFixed(2)} %</td><td className="px-2 py-1">{v.tolerancePct} %</td><td className="px-2 py-1">{v.explanation ?? (out ? 'needs an explanation' : '')}</td></tr>;
          })}</tbody>
        </table>
      )}
      {canAdd && (
        <form noValidate className="grid gap-2 rounded border border-rule bg-panel p-3 sm:grid-cols-3" onSubmit={handleSubmit((v) => add.mutate(v, { onSuccess: () => reset() }))} aria-label="Add a check value">
          <label className="text-sm">Result<select {...register('itemKey')} className="mt-1 w-full rounded border border-rule px-1">{items.map((i) => <option key={i.itemKey} value={i.itemKey}>{i.title.slice(0, 50)} ({i.caseId})</option>)}</select>{errors.itemKey && <span className="text-fail">{errors.itemKey.message}</span>}</label>
          <label className="text-sm">Your value<input aria-label="Your value" {...register('checkerValue', { valueAsNumber: true })} className="mt-1 w-full rounded border border-rule px-1" />{errors.checkerValue && <span className="text-fail">{errors.checkerValue.message}</span>}</label>
          <label className="text-sm">Explanation (if it deviates)<input {...register('explanation')} className="mt-1 w-full rounded border border-rule px-1" /></label>
          <div className="sm:col-span-3"><ErrorNote error={add.error} /><Button type="submit" disabled={add.isPending}>Record check value</Button></div>
        </form>
      )}
    </div>
  );
}
