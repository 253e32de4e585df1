import { useForm } from 'react-hook-form';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, ApiError } from '../../lib/queries/api-client';
import type { AssetDetail } from '../../lib/queries/register.queries';
import { Button, ErrorNote } from '../ui/parts';
import { FormField } from '../ui/FormField';

interface Fields {
  code: string;
  name: string;
  route: string;
  siteKind: string;
  ownerStandard: string;
  inServiceOn: string;
}

const SITE_KINDS = ['substation', 'link-box-group', 'pipeline', 'fence', 'other'];

/** Changes an asset's details; only the fields changed are sent, and each refusal shows beside its field. */
export default function AssetEditForm({ asset, onDone }: { asset: AssetDetail['asset']; onDone: () => void }) {
  const client = useQueryClient();
  const initial: Fields = { code: asset.code, name: asset.name, route: asset.route, siteKind: asset.siteKind ?? '', ownerStandard: asset.ownerStandard, inServiceOn: asset.inServiceOn ?? '' };
  const form = useForm<Fields>({ defaultValues: initial });
  const save = useMutation({
    mutationFn: (f: Fields) => {
      const changed = Object.fromEntries(
        (Object.keys(f) as Array<keyof Fields>)
          .filter((k) => f[k] !== initial[k] && !(k === 'siteKind' && asset.kind !== 'site'))
          .map((k) => [k, k === 'inServiceOn' ? f[k] || null : f[k]]),
      );
      return api(`/api/assets/${asset.id}`, { method: 'PATCH', body: changed });
    },
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: ['register'] });
      onDone();
    },
    onError: (e) => {
      if (e instanceof ApiError) for (const f of e.fields) if (f.field in initial) form.setError(f.field as keyof Fields, { message: f.message });
    },
  });
  const input = 'mt-1 block w-full rounded border border-rule bg-panel px-2 py-1';
  const err = (k: keyof Fields) => form.formState.errors[k]?.message;
  const fieldErrors = save.error instanceof ApiError ? save.error.fields.filter((f) => !(f.field in initial)) : [];
  return (
    <form aria-label="Change the asset" className="grid grid-cols-2 gap-3 rounded border border-rule p-3 text-sm md:grid-cols-3" onSubmit={form.handleSubmit((f) => save.mutate(f))}>
      <FormField label="Code" error={err('code')}>{(c) => <input {...c} className={input} {...form.register('code')} />}</FormField>
      <FormField label="Name" error={err('name')}>{(c) => <input {...c} className={input} {...form.register('name')} />}</FormField>
      {asset.kind === 'site' ? (
        <FormField label="Site kind" error={err('siteKind')}>{(c) => <select {...c} className={input} {...form.register('siteKind')}>{SITE_KINDS.map((k) => <option key={k}>{k}</option>)}</select>}</FormField>
      ) : (
        <FormField label="Route" error={err('route')}>{(c) => <input {...c} className={input} {...form.register('route')} placeholder="from, to, via" />}</FormField>
      )}
      <FormField label="Owner standard" error={err('ownerStandard')}>{(c) => <input {...c} className={input} {...form.register('ownerStandard')} />}</FormField>
      <FormField label="In service on (UTC date)" error={err('inServiceOn')}>{(c) => <input {...c} className={input} {...form.register('inServiceOn')} placeholder="YYYY-MM-DD" />}</FormField>
      <div className="col-span-full flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={save.isPending}>Save the changes</Button>
        <Button type="button" tone="plain" onClick={onDone}>Cancel</Button>
        {fieldErrors.map((f) => <span key={f.field} className="text-xs text-fail">{f.message}</span>)}
        {save.error && !(save.error instanceof ApiError && save.error.fields.length) && <ErrorNote error={save.error} />}
      </div>
    </form>
  );
}
