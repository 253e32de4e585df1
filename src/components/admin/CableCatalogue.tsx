import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../lib/queries/api-client';
import { cableCatalogueQuery } from '../../lib/queries/catalogue.queries';
import { cableTypeSchema } from '../../lib/schemas/bonding-study.schema';
import { Field } from '../editor/form-fields';
import { Button, ErrorNote } from '../ui/parts';

type Values = z.input<typeof cableTypeSchema>;

const FIELDS: Array<[keyof Values, string]> = [
  ['conductorResistanceOhmPerKm', 'Conductor R (Ω/km)'],
  ['conductorGmrMm', 'Conductor GMR (mm)'],
  ['sheathMeanDiameterMm', 'Sheath mean dia. (mm)'],
  ['sheathResistanceOhmPerKm', 'Sheath R (Ω/km)'],
  ['oversheathThicknessMm', 'Oversheath (mm)'],
  ['overallDiameterMm', 'Overall dia. (mm)'],
  ['oversheathWithstandKv', 'Oversheath withstand (kV)'],
];

/** The cable catalogue designers copy from; entries are added, never edited, so studies stay traceable. */
export default function CableCatalogue() {
  const queryClient = useQueryClient();
  const catalogue = useQuery(cableCatalogueQuery());
  const { register, handleSubmit, reset, formState: { errors } } = useForm<Values>({ resolver: zodResolver(cableTypeSchema) });
  const add = useMutation({
    mutationFn: (v: Values) => api('/api/admin/cable-types', { method: 'POST', body: v }),
    onSuccess: () => { reset(); return queryClient.invalidateQueries({ queryKey: ['cable-types'] }); },
  });
  return (
    <section className="rounded-lg border border-rule bg-panel p-4" aria-labelledby="catalogue">
      <h2 id="catalogue" className="mb-2 text-lg font-semibold">Cable types</h2>
      <table className="mb-3 w-full text-sm" data-testid="cable-types">
        <thead className="text-left text-xs text-ink-soft"><tr><th>Code</th><th>Name</th>{FIELDS.map(([, l]) => <th key={l}>{l}</th>)}</tr></thead>
        <tbody>{catalogue.data?.cableTypes.map((c) => <tr key={c.id} className="border-t border-rule"><td className="py-1 font-mono">{c.code}</td><td>{c.data.name}</td>{FIELDS.map(([k]) => <td key={k} className="font-mono">{String(c.data[k])}</td>)}</tr>)}</tbody>
      </table>
      <form noValidate onSubmit={handleSubmit((v) => add.mutate(v))} className="flex flex-wrap items-end gap-2" aria-label="Add a cable type">
        <Field register={register} errors={errors} name="id" label="Code" type="text" className="w-28" />
        <Field register={register} errors={errors} name="name" label="Name" type="text" className="w-64" />
        {FIELDS.map(([k, l]) => <Field key={k} register={register} errors={errors} name={k} label={l} />)}
        <Button type="submit" disabled={add.isPending}>Add to the catalogue</Button>
      </form>
      <ErrorNote error={add.error} />
    </section>
  );
}
