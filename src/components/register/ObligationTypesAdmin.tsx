import { useForm } from 'react-hook-form';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api, ApiError } from '../../lib/queries/api-client';
import { obligationTypesQuery } from '../../lib/queries/register.queries';
import { withQueryClient } from '../ui/with-query-client';
import { Busy, Button, ErrorNote } from '../ui/parts';
import { FormField } from '../ui/FormField';

interface Fields {
  ownerStandard: string;
  name: string;
  appliesTo: 'circuit' | 'site' | 'both';
  firstDueMonths: string;
  intervalMonths: string;
  quantity: string;
  unit: string;
  comparison: 'at-least' | 'at-most';
  limit: string;
  remindDaysBefore: string;
  basis: string;
}

/** The administrator's list of obligation types per owner standard, and a form to add one. */
function ObligationTypesAdmin() {
  const client = useQueryClient();
  const { data, isPending, error } = useQuery(obligationTypesQuery());
  const form = useForm<Fields>({ defaultValues: { appliesTo: 'circuit', comparison: 'at-least', firstDueMonths: '0', intervalMonths: '', remindDaysBefore: '30' } });
  const add = useMutation({
    mutationFn: (f: Fields) =>
      api('/api/admin/obligation-types', {
        method: 'POST',
        body: {
          ownerStandard: f.ownerStandard,
          name: f.name,
          appliesTo: f.appliesTo,
          firstDueMonths: Number(f.firstDueMonths),
          intervalMonths: f.intervalMonths.trim() ? Number(f.intervalMonths) : null,
          criterion: f.quantity.trim() ? { quantity: f.quantity, unit: f.unit, comparison: f.comparison, limit: Number(f.limit) } : null,
          remindDaysBefore: Number(f.remindDaysBefore),
          basis: f.basis,
        },
      }),
    onSuccess: () => {
      form.reset();
      void client.invalidateQueries({ queryKey: ['register'] });
    },
    onError: (e) => {
      if (e instanceof ApiError) for (const f of e.fields) form.setError(f.field.split('.').pop() as keyof Fields, { message: f.message });
    },
  });
  const input = 'mt-1 block w-full rounded border border-rule bg-panel px-2 py-1';
  const err = (k: keyof Fields) => form.formState.errors[k]?.message;
  return (
    <section className="mt-8 space-y-3" aria-label="Obligation types">
      <h2 className="text-lg font-bold">Obligation types per owner standard</h2>
      <p className="text-sm text-ink-soft">Every asset under an owner standard owes its types from the day it enters service. Say where each interval comes from; the demo's are invented.</p>
      {error ? <ErrorNote error={error} /> : isPending ? <Busy label="Loading…" /> : (
        <table className="w-full rounded border border-rule bg-panel text-sm">
          <thead className="bg-copper-light text-left"><tr>{['Owner standard', 'Obligation', 'Applies to', 'First due', 'Interval', 'Criterion', 'Reminder', 'Basis'].map((h) => <th key={h} className="px-3 py-1.5">{h}</th>)}</tr></thead>
          <tbody>
            {data.obligationTypes.map((t) => (
              <tr key={t.id} className="border-t border-rule">
                <td className="px-3 py-1.5">{t.ownerStandard}</td>
                <td className="px-3 py-1.5">{t.name}</td>
                <td className="px-3 py-1.5">{t.appliesTo}</td>
                <td className="px-3 py-1.5">{t.firstDueMonths} months after service</td>
                <td className="px-3 py-1.5">{t.intervalMonths === null ? 'once' : `${t.intervalMonths} months`}</td>
                <td className="px-3 py-1.5">{t.criterion ? `${t.criterion.quantity} ${t.criterion.comparison === 'at-least' ? '≥' : '≤'} ${t.criterion.limit} ${t.criterion.unit}` : '—'}</td>
                <td className="px-3 py-1.5">{t.remindDaysBefore} days before</td>
                <td className="px-3 py-1.5">{t.basis}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <form className="grid grid-cols-2 gap-3 rounded border border-rule bg-panel p-3 text-sm md:grid-cols-4" onSubmit={form.handleSubmit((f) => add.mutate(f))}>
        <FormField label="Owner standard" error={err('ownerStandard')}>{(c) => <input {...c} className={input} {...form.register('ownerStandard')} />}</FormField>
        <FormField label="Obligation" error={err('name')}>{(c) => <input {...c} className={input} {...form.register('name')} />}</FormField>
        <FormField label="Applies to">{(c) => <select {...c} className={input} {...form.register('appliesTo')}><option value="circuit">circuits</option><option value="site">sites</option><option value="both">both</option></select>}</FormField>
        <FormField label="First due, months after service" error={err('firstDueMonths')}>{(c) => <input {...c} className={input} {...form.register('firstDueMonths')} />}</FormField>
        <FormField label="Interval, months (empty: once)" error={err('intervalMonths')}>{(c) => <input {...c} className={input} {...form.register('intervalMonths')} />}</FormField>
        <FormField label="Measured quantity (empty: none)" error={err('quantity')}>{(c) => <input {...c} className={input} {...form.register('quantity')} />}</FormField>
        <FormField label="Unit">{(c) => <input {...c} className={input} {...form.register('unit')} />}</FormField>
        <FormField label="Criterion">{(c) => <select {...c} className={input} {...form.register('comparison')}><option value="at-least">at least</option><option value="at-most">at most</option></select>}</FormField>
        <FormField label="Limit" error={err('limit')}>{(c) => <input {...c} className={input} {...form.register('limit')} />}</FormField>
        <FormField label="Remind, days before" error={err('remindDaysBefore')}>{(c) => <input {...c} className={input} {...form.register('remindDaysBefore')} />}</FormField>
        <FormField className="md:col-span-2" label="Basis (clause of the owner standard)" error={err('basis')}>{(c) => <input {...c} className={input} {...form.register('basis')} />}</FormField>
        <div className="col-span-full"><Button type="submit" disabled={add.isPending}>Add the obligation type</Button></div>
        {add.error && !(add.error instanceof ApiError && add.error.fields.length) && <div className="col-span-full"><ErrorNote error={add.error} /></div>}
      </form>
    </section>
  );
}

export default withQueryClient(ObligationTypesAdmin);
