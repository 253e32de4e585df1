import { useForm } from 'react-hook-form';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, ApiError } from '../../lib/queries/api-client';
import { Button, ErrorNote } from '../ui/parts';
import { FormField } from '../ui/FormField';

interface Fields {
  kind: 'circuit' | 'site';
  siteKind: string;
  code: string;
  name: string;
  route: string;
  ownerStandard: string;
  inServiceOn: string;
}

/** Adds a circuit or site to the project's register. */
export default function NewAssetForm({ projectId, onCreated }: { projectId: string; onCreated: (id: string) => void }) {
  const client = useQueryClient();
  const form = useForm<Fields>({ defaultValues: { kind: 'circuit', siteKind: 'substation', code: '', name: '', route: '', ownerStandard: '', inServiceOn: '' } });
  const create = useMutation({
    mutationFn: (f: Fields) => api<{ id: string }>(`/api/projects/${projectId}/assets`, { method: 'POST', body: { ...f, siteKind: f.kind === 'site' ? f.siteKind : undefined, inServiceOn: f.inServiceOn || null } }),
    onSuccess: (a) => {
      void client.invalidateQueries({ queryKey: ['register'] });
      onCreated(a.id);
    },
    onError: (e) => {
      if (e instanceof ApiError) for (const f of e.fields) form.setError(f.field as keyof Fields, { message: f.message });
    },
  });
  const kind = form.watch('kind');
  const input = 'mt-1 block w-full rounded border border-rule bg-panel px-2 py-1';
  const err = (k: keyof Fields) => form.formState.errors[k]?.message;
  return (
    <form className="grid grid-cols-2 gap-3 rounded-lg border border-rule bg-panel p-4 text-sm md:grid-cols-4" onSubmit={form.handleSubmit((f) => create.mutate(f))}>
      <FormField label="Kind" error={err('kind')}>{(c) => <select {...c} className={input} {...form.register('kind')}><option value="circuit">circuit</option><option value="site">site</option></select>}</FormField>
      {kind === 'site' && (
        <FormField label="Site kind" error={err('siteKind')}>{(c) => <select {...c} className={input} {...form.register('siteKind')}>{['substation', 'link-box-group', 'pipeline', 'fence', 'other'].map((k) => <option key={k}>{k}</option>)}</select>}</FormField>
      )}
      <FormField label="Code" error={err('code')}>{(c) => <input {...c} className={input} {...form.register('code')} />}</FormField>
      <FormField label="Name" error={err('name')}>{(c) => <input {...c} className={input} {...form.register('name')} />}</FormField>
      <FormField label="Route" error={err('route')}>{(c) => <input {...c} className={input} {...form.register('route')} placeholder="from, to, via" />}</FormField>
      <FormField label="Owner standard" error={err('ownerStandard')}>{(c) => <input {...c} className={input} {...form.register('ownerStandard')} />}</FormField>
      <FormField label="In service on (UTC date)" error={err('inServiceOn')}>{(c) => <input {...c} className={input} {...form.register('inServiceOn')} placeholder="YYYY-MM-DD" />}</FormField>
      <div className="col-span-full flex items-center gap-3">
        <Button type="submit" disabled={create.isPending}>Add the asset</Button>
        {create.error && !(create.error instanceof ApiError && create.error.fields.length) && <ErrorNote error={create.error} />}
      </div>
    </form>
  );
}
