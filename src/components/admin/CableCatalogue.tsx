import { useForm, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import { cableCatalogueQuery } from '../../lib/queries/catalogue.queries';
import { cableTypeSchema, type CableType } from '../../lib/schemas/bonding-study.schema';
import { Field } from '../editor/form-fields';
import { Button, ErrorNote } from '../ui/parts';
import CableDerivation from './cable/CableDerivation';
import ConstructionFields from './cable/ConstructionFields';
import { cleanFormValues } from './cable/clean-form-values';

// Loose on purpose: the form holds either kind of cable type until the schema decides.
type Values = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

const ENGINE_FIELDS = [
  ['conductorResistanceOhmPerKm', 'Conductor R (Ω/km)'],
  ['conductorGmrMm', 'Conductor GMR (mm)'],
  ['sheathMeanDiameterMm', 'Sheath mean dia. (mm)'],
  ['sheathResistanceOhmPerKm', 'Sheath R (Ω/km)'],
] as const;
const COMMON_FIELDS = [
  ['oversheathThicknessMm', 'Oversheath (mm)'],
  ['overallDiameterMm', 'Overall dia. (mm)'],
  ['oversheathWithstandKv', 'Oversheath withstand (kV)'],
] as const;

const DEFAULTS: Values = {
  entry: 'direct',
  construction: { frequencyHz: 50, conductor: { material: 'copper', stranding: 'stranded', strandCount: 61 }, screen: { kind: 'tubular', material: 'lead' } },
};

const zod = zodResolver(cableTypeSchema) as unknown as Resolver<Values>;
const resolver: Resolver<Values> = (values, context, options) => zod(cleanFormValues(values) as Values, context, options);

const shown = (v: number) => String(Number(v.toPrecision(4)));

/** The cable catalogue designers copy from; entries are added, never edited, so studies stay traceable. */
export default function CableCatalogue() {
  const queryClient = useQueryClient();
  const catalogue = useQuery(cableCatalogueQuery());
  // Unmounted fields (the other entry kind, the other screen kind) leave the values, so only what is shown is sent.
  const { register, handleSubmit, reset, watch, formState: { errors } } = useForm<Values>({ resolver, defaultValues: DEFAULTS, shouldUnregister: true });
  const add = useMutation({
    mutationFn: (v: Values) => api('/api/admin/cable-types', { method: 'POST', body: v }),
    onSuccess: () => { reset(DEFAULTS); return queryClient.invalidateQueries({ queryKey: ['cable-types'] }); },
  });
  const entry = watch('entry');
  const preview = entry === 'construction' ? cableTypeSchema.safeParse(cleanFormValues(watch())) : null;
  return (
    <section className="rounded-lg border border-rule bg-panel p-4" aria-labelledby="catalogue">
      <h2 id="catalogue" className="mb-2 text-lg font-semibold">Cable types</h2>
      <p className="mb-2 text-xs text-ink-soft">
        Figures derived from a construction follow IEC 60287-1-1 as each row states; check them against the maker's data sheet and the owner's standards before a study relies on them.
      </p>
      <table className="mb-3 w-full text-sm" data-testid="cable-types">
        <thead className="text-left text-xs text-ink-soft"><tr><th>Code</th><th>Name</th><th>Entered as</th>{[...ENGINE_FIELDS, ...COMMON_FIELDS].map(([, l]) => <th key={l}>{l}</th>)}</tr></thead>
        {catalogue.data?.cableTypes.map((c) => <CatalogueRow key={c.id} code={c.code} type={c.data} />)}
      </table>
      <form noValidate onSubmit={handleSubmit((v) => add.mutate(cleanFormValues(v) as Values))} className="flex flex-wrap items-end gap-2" aria-label="Add a cable type">
        <Field register={register} errors={errors} name="id" label="Code" type="text" className="w-28" />
        <Field register={register} errors={errors} name="name" label="Name" type="text" className="w-64" />
        <label className="block text-xs">
          <span className="text-ink-soft">Entered as</span>
          <select aria-label="Entered as" {...register('entry')} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
            <option value="direct">maker's figures</option>
            <option value="construction">construction (figures derived)</option>
          </select>
        </label>
        {entry === 'construction' ? <ConstructionFields register={register} errors={errors} watch={watch} /> : ENGINE_FIELDS.map(([k, l]) => <Field key={k} register={register} errors={errors} name={k} label={l} />)}
        {COMMON_FIELDS.map(([k, l]) => <Field key={k} register={register} errors={errors} name={k} label={l} />)}
        <Button type="submit" disabled={add.isPending}>Add to the catalogue</Button>
      </form>
      {preview?.success && preview.data.entry === 'construction' && (
        <div className="mt-2" data-testid="cable-preview">
          <CableDerivation construction={preview.data.construction} caption="What this construction gives (not yet saved)" />
        </div>
      )}
      <ErrorNote error={add.error} />
    </section>
  );
}

function CatalogueRow({ code, type }: { code: string; type: CableType }) {
  const derived = type.entry === 'construction';
  return (
    <tbody>
      <tr className="border-t border-rule">
        <td className="py-1 font-mono">{code}</td>
        <td>{type.name}</td>
        <td className="text-xs">{derived ? 'construction' : "maker's figures"}</td>
        {ENGINE_FIELDS.map(([k]) => <td key={k} className="font-mono" title={derived ? 'derived: see below' : "maker's figure"}>{shown(type[k])}{derived ? '*' : ''}</td>)}
        {COMMON_FIELDS.map(([k]) => <td key={k} className="font-mono">{String(type[k])}</td>)}
      </tr>
      {derived && (
        <tr>
          <td colSpan={3 + ENGINE_FIELDS.length + COMMON_FIELDS.length} className="pb-2 pl-4">
            <details>
              <summary className="cursor-pointer text-xs text-ink-soft">* How {code}'s figures were derived</summary>
              <CableDerivation construction={type.construction} caption={`${code}: derived figures, formulas and sources`} />
            </details>
          </td>
        </tr>
      )}
    </tbody>
  );
}
