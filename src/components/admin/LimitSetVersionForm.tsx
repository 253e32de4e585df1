import { useFieldArray, useForm, type FieldPath } from 'react-hook-form';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import { criterionKeys, criterionUnits, limitSetVersionSchema, type CriterionKey } from '../../lib/schemas/limit-set.schema';
import type { ManualItem } from '../../lib/schemas/manual-item.schema';
import { criterionLabel } from '../../lib/compare/labels';
import { Button, ErrorNote } from '../ui/parts';

type Latest = { limits: Record<string, { value: number; unit: string; source: string }>; manualItems: unknown[]; checkTolerancePct: number } | null;

interface FormValues {
  limits: Record<CriterionKey, { applies: boolean; value: string; source: string }>;
  manualItems: ManualItem[];
  checkTolerancePct: string;
}

const field = 'rounded border border-rule px-1';
const Problem = ({ message }: { message?: string }) => (message ? <span role="alert" className="block text-xs text-fail">{message}</span> : null);

/** Form values from the latest version: every criterion listed, the ones it sets ticked. */
function startingValues(latest: Latest): FormValues {
  const limits = Object.fromEntries(
    criterionKeys.map((k) => {
      const l = latest?.limits[k];
      return [k, { applies: !!l, value: l ? String(l.value) : '', source: l?.source ?? '' }];
    }),
  ) as FormValues['limits'];
  return { limits, manualItems: (latest?.manualItems ?? []) as ManualItem[], checkTolerancePct: String(latest?.checkTolerancePct ?? 2) };
}

/** A blank cell is not zero: it stays NaN so the check says the value is missing. */
const numberOf = (text: string) => (text.trim() === '' ? Number.NaN : Number(text.trim().replace(',', '.')));

/**
 * The next version of a limit set, field by field: each criterion's value with its source, the
 * check tolerance and the people-answered questions. Checked with the server's own schema before
 * sending, each problem beside its field; nothing is published until all are fixed.
 */
export default function LimitSetVersionForm({ limitSetId, latest, onDone }: { limitSetId: string; latest: Latest; onDone: () => void }) {
  const queryClient = useQueryClient();
  const { register, handleSubmit, control, watch, setError, formState: { errors } } = useForm<FormValues>({ defaultValues: startingValues(latest) });
  const questions = useFieldArray({ control, name: 'manualItems' });
  const publish = useMutation({
    mutationFn: (body: unknown) => api(`/api/admin/limit-sets/${limitSetId}/versions`, { method: 'POST', body }),
    onSuccess: () => { onDone(); return queryClient.invalidateQueries({ queryKey: ['limit-sets'] }); },
  });

  const submit = handleSubmit((v) => {
    const body = {
      limits: Object.fromEntries(
        criterionKeys.filter((k) => v.limits[k].applies).map((k) => [k, { value: numberOf(v.limits[k].value), unit: criterionUnits[k], source: v.limits[k].source }]),
      ),
      manualItems: v.manualItems,
      checkTolerancePct: numberOf(v.checkTolerancePct),
    };
    const parsed = limitSetVersionSchema.safeParse(body);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const [head, key, leaf] = issue.path as (string | number)[];
        const name = head === 'limits' && key !== undefined ? `limits.${key}.${leaf === 'source' ? 'source' : 'value'}` : issue.path.join('.') || 'root';
        // A blank or unreadable cell reads as NaN: say what to type rather than what the parser expected.
        const message = head === 'limits' && leaf === 'value' && issue.code === 'invalid_type' ? 'Give this limit as a number.' : issue.message;
        setError(name as FieldPath<FormValues>, { message }, { shouldFocus: true });
      }
      return;
    }
    publish.mutate(parsed.data);
  });

  const limitErrors = errors.limits as Record<string, { value?: { message?: string }; source?: { message?: string } }> & { message?: string; root?: { message?: string } } | undefined;
  return (
    <form noValidate onSubmit={submit} className="mt-2 space-y-3 rounded border border-rule p-3" aria-label="New limit set version">
      <table className="w-full text-sm">
        <thead className="text-left text-xs text-ink-soft"><tr><th className="py-1">Applies</th><th>Criterion</th><th>Limit</th><th>Source (document and clause, “common practice” or “owner’s standard”)</th></tr></thead>
        <tbody>
          {criterionKeys.map((k) => {
            const applies = watch(`limits.${k}.applies`);
            return (
              <tr key={k} className="border-t border-rule align-top">
                <td className="py-1"><input type="checkbox" aria-label={`${criterionLabel(k)} applies`} {...register(`limits.${k}.applies`)} /></td>
                <td className="py-1 pr-2">{criterionLabel(k)}</td>
                <td className="py-1 pr-2 whitespace-nowrap">
                  <input aria-label={`${criterionLabel(k)} limit`} inputMode="decimal" disabled={!applies} className={`${field} w-24 font-mono`} {...register(`limits.${k}.value`)} /> {criterionUnits[k] || '(ratio)'}
                  <Problem message={limitErrors?.[k]?.value?.message} />
                </td>
                <td className="py-1">
                  <input aria-label={`${criterionLabel(k)} source`} disabled={!applies} className={`${field} w-full`} {...register(`limits.${k}.source`)} />
                  <Problem message={limitErrors?.[k]?.source?.message} />
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <Problem message={limitErrors?.message ?? limitErrors?.root?.message} />
      <label className="block text-sm">Check tolerance (%), how far a checker’s own value may differ from the computed one
        <input aria-label="Check tolerance (%)" inputMode="decimal" className={`${field} ml-2 w-20 font-mono`} {...register('checkTolerancePct')} />
        <Problem message={errors.checkTolerancePct?.message} />
      </label>
      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold">Questions people answer on every check</legend>
        {questions.fields.map((q, i) => (
          <div key={q.id} className="grid gap-2 border-t border-rule pt-2 text-sm sm:grid-cols-[10rem_1fr_14rem_auto]">
            <label>Key<input aria-label={`Question ${i + 1} key`} className={`${field} w-full font-mono`} {...register(`manualItems.${i}.key`)} /><Problem message={errors.manualItems?.[i]?.key?.message} /></label>
            <label>Question<input aria-label={`Question ${i + 1} text`} className={`${field} w-full`} {...register(`manualItems.${i}.text`)} /><Problem message={errors.manualItems?.[i]?.text?.message} /></label>
            <label>Basis<input aria-label={`Question ${i + 1} basis`} className={`${field} w-full`} {...register(`manualItems.${i}.basis`)} /><Problem message={errors.manualItems?.[i]?.basis?.message} /></label>
            <Button type="button" tone="plain" onClick={() => questions.remove(i)}>Remove</Button>
          </div>
        ))}
        <Problem message={errors.manualItems?.message ?? errors.manualItems?.root?.message} />
        <Button type="button" tone="plain" onClick={() => questions.append({ key: '', text: '', basis: 'common practice' })}>Add a question</Button>
      </fieldset>
      <div className="flex gap-2">
        <Button type="submit" disabled={publish.isPending}>Publish this version</Button>
        <Button type="button" tone="plain" onClick={onDone}>Cancel</Button>
      </div>
      <ErrorNote error={publish.error} />
    </form>
  );
}
