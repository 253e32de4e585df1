import { useState } from 'react';
import { useFieldArray, useFormContext } from 'react-hook-form';
import { useQuery } from '@tanstack/react-query';
import { cableCatalogueQuery } from '../../lib/queries/catalogue.queries';
import { Button } from '../ui/parts';
import { Num, Text, box } from './fields';
import { removeCircuit } from '../../lib/route-edits/circuit-edits';
import { cableConstructionSchema } from '../../lib/schemas/bonding-study.schema';
import { deriveCableParameters } from '../../lib/calc/cable/derive-cable';
import CableConstructionFields, { DERIVED_FIGURES, STARTING_CONSTRUCTION } from './CableConstructionFields';

/** Cable types (typed here or from the catalogue) and the circuits, each with its cable type. */
export default function CablesSection({ onNotes }: { onNotes: (notes: string[]) => void }) {
  const { control, watch, getValues, register, reset, setValue } = useFormContext();
  const cableTypes = useFieldArray({ control, name: 'cableTypes' });
  const circuits = useFieldArray({ control, name: 'circuits' });
  const catalogue = useQuery(cableCatalogueQuery());
  const [fromCatalogue, setFromCatalogue] = useState('');
  const typeIds: string[] = (watch('cableTypes') ?? []).map((t: { id: string }) => t.id);

  // Direct keeps the figures last derived, as a starting point; construction starts from an illustrative cable.
  function chooseEntry(i: number, construction: boolean) {
    const { construction: _c, entry: _e, ...rest } = getValues(`cableTypes.${i}`);
    if (construction) {
      for (const key of DERIVED_FIGURES) delete rest[key];
      setValue(`cableTypes.${i}`, { ...rest, entry: 'construction', construction: STARTING_CONSTRUCTION }, { shouldDirty: true, shouldValidate: true });
    } else {
      const parsed = cableConstructionSchema.safeParse(_c);
      const derived = parsed.success ? deriveCableParameters(parsed.data) : undefined;
      const figures = derived ? Object.fromEntries(DERIVED_FIGURES.map((k) => [k, derived[k]])) : {};
      setValue(`cableTypes.${i}`, { ...rest, ...figures, entry: 'direct' }, { shouldDirty: true, shouldValidate: true });
    }
    onNotes([construction ? `Cable type ${rest.id} now starts from an illustrative construction: enter the cable's own.` : `Cable type ${rest.id} now takes the maker's figures, starting from those last derived.`]);
  }

  function addCircuit() {
    const taken = new Set(getValues('circuits').map((c: { id: string }) => c.id));
    let n = circuits.fields.length + 1;
    while (taken.has(`C${n}`)) n++;
    const id = `C${n}`;
    circuits.append({ id, name: `Circuit ${n}`, cableTypeId: typeIds[0] ?? '' });
    // Place it beside the others in every layout, and give it a current in every balanced case.
    const layouts = getValues('layouts').map((l: { circuits: Array<{ centreXM?: number }> }) => ({ ...l, circuits: [...l.circuits, { circuitId: id, formation: 'trefoil', spacingM: 0.11, depthM: 1.2, centreXM: l.circuits.length * 1.0 }] }));
    setValue('layouts', layouts, { shouldDirty: true });
    const cases = getValues('cases').map((c: { kind: string; currents?: unknown[] }) => (['normal', 'emergency', 'three-phase-fault'].includes(c.kind) ? { ...c, currents: [...(c.currents ?? []), { circuitId: id, currentA: 0, angleDeg: 0 }] } : c));
    setValue('cases', cases, { shouldDirty: true });
    onNotes([`Circuit ${id} placed in every layout at ${'1 m'} steps beside the others, and given 0 A in each load and three-phase case: set its position and currents.`]);
  }

  return (
    <section className={box} aria-label="Cable types and circuits">
      <h3 className="mb-2 font-semibold">Cable types</h3>
      {cableTypes.fields.map((f, i) => {
        const construction = watch(`cableTypes.${i}.entry`) === 'construction';
        return (
          <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2 border-b border-rule pb-2">
            <Text name={`cableTypes.${i}.id`} label={`Id of cable type ${i + 1}`} width="w-20" />
            <Text name={`cableTypes.${i}.name`} label={`Name of cable type ${i + 1}`} width="w-56" />
            <label className="block text-xs">
              <span className="text-ink-soft">Entered as</span>
              <select aria-label={`Entry of cable type ${i + 1}`} value={construction ? 'construction' : 'direct'} onChange={(e) => chooseEntry(i, e.target.value === 'construction')} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
                <option value="direct">the maker's figures</option>
                <option value="construction">its construction</option>
              </select>
            </label>
            {construction ? (
              <CableConstructionFields i={i} />
            ) : (
              <>
                <Num name={`cableTypes.${i}.conductorResistanceOhmPerKm`} label="Conductor R (Ω/km)" />
                <Num name={`cableTypes.${i}.conductorGmrMm`} label="Conductor GMR (mm)" />
                <Num name={`cableTypes.${i}.sheathMeanDiameterMm`} label="Sheath mean dia. (mm)" />
                <Num name={`cableTypes.${i}.sheathResistanceOhmPerKm`} label="Sheath R (Ω/km)" />
              </>
            )}
            <Num name={`cableTypes.${i}.oversheathThicknessMm`} label="Oversheath (mm)" />
            <Num name={`cableTypes.${i}.overallDiameterMm`} label="Overall dia. (mm)" />
            <Num name={`cableTypes.${i}.oversheathWithstandKv`} label="Oversheath withstand (kV)" />
            <Button tone="danger" onClick={() => cableTypes.remove(i)} disabled={cableTypes.fields.length === 1}>Remove cable type</Button>
          </div>
        );
      })}
      <div className="flex flex-wrap items-end gap-2">
        <label className="text-xs"><span className="text-ink-soft">From the catalogue</span>
          <select aria-label="Cable type from the catalogue" className="mt-0.5 block rounded border border-rule px-1 py-0.5" value={fromCatalogue} onChange={(e) => setFromCatalogue(e.target.value)}>
            <option value="">choose…</option>
            {catalogue.data?.cableTypes.map((c) => <option key={c.id} value={c.code}>{c.code}: {c.data.name}</option>)}
          </select>
        </label>
        <Button tone="plain" disabled={!fromCatalogue} onClick={() => { const c = catalogue.data?.cableTypes.find((x) => x.code === fromCatalogue); if (c && !typeIds.includes(c.code)) cableTypes.append(c.data); }}>Add to the study</Button>
      </div>

      <h3 className="mb-1 mt-4 font-semibold">Circuits</h3>
      {circuits.fields.map((f, i) => {
        const id = getValues(`circuits.${i}.id`);
        return (
          <div key={f.id} className="flex flex-wrap items-end gap-2" data-testid="circuit-row">
            <Text name={`circuits.${i}.id`} label={`Id of circuit ${i + 1}`} width="w-16" readOnly />
            <Text name={`circuits.${i}.name`} label={`Name of circuit ${id}`} width="w-56" />
            <label className="block text-xs"><span className="text-ink-soft">Cable type</span>
              <select aria-label={`Cable type of ${id}`} {...register(`circuits.${i}.cableTypeId`)} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
                {typeIds.map((t) => <option key={t} value={t}>{t}</option>)}
              </select>
            </label>
            <Button tone="danger" disabled={circuits.fields.length === 1} onClick={() => { const r = removeCircuit(getValues() as never, id); reset(r.study, { keepDefaultValues: true }); onNotes(r.notes); }}>Remove circuit {id}</Button>
          </div>
        );
      })}
      <Button tone="plain" className="mt-2" onClick={addCircuit}>Add circuit</Button>
    </section>
  );
}
