import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../lib/queries/api-client';
import { limitSetsQuery } from '../../lib/queries/studies.queries';
import { newStudySchema } from '../../lib/schemas/new-study.schema';
import { defaultBondingInputs, defaultExposureInputs } from '../../lib/studies/default-inputs';
import { Button, ErrorNote } from '../ui/parts';

const formSchema = newStudySchema.omit({ inputs: true });
type FormValues = z.input<typeof formSchema>;

/** Starts a study from small illustrative inputs, to be edited in the study editor. */
export default function NewStudyForm({ projectId }: { projectId: string }) {
  const limitSets = useQuery(limitSetsQuery());
  const { register, handleSubmit, formState: { errors } } = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { kind: 'bonding' } });
  const create = useMutation({
    mutationFn: (v: FormValues) =>
      api<{ revision: { id: string } }>(`/api/projects/${projectId}/studies`, {
        method: 'POST',
        body: { ...v, inputs: v.kind === 'bonding' ? defaultBondingInputs(v.title) : defaultExposureInputs(v.title) },
      }),
    onSuccess: (r) => window.location.assign(`/revisions/${r.revision.id}`),
  });
  const field = 'mt-1 w-full rounded border border-rule bg-panel px-2 py-1';
  return (
    <form onSubmit={handleSubmit((v) => create.mutate(v))} noValidate className="grid gap-3 rounded-lg border border-copper bg-panel p-4 sm:grid-cols-2" aria-label="New study">
      <label className="text-sm">Code<input aria-label="Code" {...register('code')} className={field} />{errors.code && <span className="text-fail">{errors.code.message}</span>}</label>
      <label className="text-sm">Title<input aria-label="Title" {...register('title')} className={field} />{errors.title && <span className="text-fail">{errors.title.message}</span>}</label>
      <label className="text-sm">Kind<select aria-label="Kind" {...register('kind')} className={field}><option value="bonding">Cable bonding</option><option value="exposure">Metalwork exposure</option></select></label>
      <label className="text-sm">Limit set<select aria-label="Limit set" {...register('limitSetId')} className={field} defaultValue=""><option value="" disabled>choose…</option>{limitSets.data?.limitSets.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}</select>{errors.limitSetId && <span className="text-fail">{errors.limitSetId.message}</span>}</label>
      <div className="sm:col-span-2"><ErrorNote error={create.error} /></div>
      <div className="sm:col-span-2"><Button type="submit" disabled={create.isPending}>{create.isPending ? 'Creating…' : 'Create and open the editor'}</Button></div>
    </form>
  );
}
