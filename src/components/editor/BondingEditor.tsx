import { useEffect, useRef, useState } from 'react';
import { Controller, useFieldArray, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { cableCatalogueQuery } from '../../lib/queries/catalogue.queries';
import { bondingStudySchema, type BondingStudyInput } from '../../lib/schemas/bonding-study.schema';
import { ApiError, api } from '../../lib/queries/api-client';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { Button, ErrorNote, Busy } from '../ui/parts';
import { Field, FieldMessage } from './form-fields';
import CrossSectionSketch from './CrossSectionSketch';
import { parseSections, sectionsToCsv } from './sections-csv';

type Form = BondingStudyInput;
const box = 'rounded-lg border border-rule bg-panel p-3';

/** The designer's editor for a bonding study: every field validated by the same schema the server uses. */
export default function BondingEditor({ detail, readOnly }: { detail: RevisionDetail; readOnly: boolean }) {
  const queryClient = useQueryClient();
  const r = detail.revision;
  const form = useForm<Form>({ resolver: zodResolver(bondingStudySchema) as never, defaultValues: r.inputs as Form, mode: 'onBlur' });
  const { register, control, handleSubmit, formState, watch, setError, reset, getValues, setValue } = form;
  const { errors, isDirty } = formState;
  const sections = useFieldArray({ control, name: 'sections' });
  const groups = useFieldArray({ control, name: 'bonding' });
  const cases = useFieldArray({ control, name: 'cases' });
  const cableTypes = useFieldArray({ control, name: 'cableTypes' });
  const svls = useFieldArray({ control, name: 'svls' });
  const circuits = useFieldArray({ control, name: 'circuits' });
  const eccs = useFieldArray({ control, name: 'eccs' });
  const catalogue = useQuery(cableCatalogueQuery());
  const [fromCatalogue, setFromCatalogue] = useState('');
  const [pasteText, setPasteText] = useState('');
  const [pasteError, setPasteError] = useState<string | null>(null);
  const fileInput = useRef<HTMLInputElement>(null);

  useEffect(() => {
    const warn = (e: BeforeUnloadEvent) => { if (isDirty) e.preventDefault(); };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [isDirty]);

  const save = useMutation({
    mutationFn: (inputs: Form) => api<{ version: number }>(`/api/revisions/${r.id}/inputs`, { method: 'PUT', body: { version: r.version, inputs } }),
    onSuccess: async (_d, inputs) => {
      reset(inputs);
      await queryClient.invalidateQueries({ queryKey: ['revision', r.id] });
    },
    onError: (e) => {
      if (e instanceof ApiError) for (const f of e.fields) setError(f.field.replace(/^inputs\./, '') as never, { message: f.message });
    },
  });
  const calculate = useMutation({
    mutationFn: () => api(`/api/revisions/${r.id}/calculate`, { method: 'POST' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['revision', r.id] }),
  });

  const layouts = watch('layouts');
  const ids = (watch('sections') ?? []).map((s) => s.id);
  const lock = readOnly;

  function splitSection(i: number) {
    const s = getValues(`sections.${i}`);
    const half = Number(s.lengthM) / 2;
    const a = { ...s, id: `${s.id}a`, lengthM: half };
    const b = { ...s, id: `${s.id}b`, lengthM: half, phaseRotation: s.phaseRotation ?? 0 };
    sections.remove(i);
    sections.insert(i, [a, b]);
    setValue('bonding', getValues('bonding').map((g) => ({ ...g, sectionIds: g.sectionIds.flatMap((id) => (id === s.id ? [a.id, b.id] : [id])) })), { shouldDirty: true });
  }
  function replaceSections(text: string) {
    const parsed = parseSections(text, layouts?.[0]?.id ?? 'L1');
    if ('error' in parsed) return setPasteError(parsed.error);
    setPasteError(null);
    sections.replace(parsed.rows);
  }
  function exportCsv() {
    const url = URL.createObjectURL(new Blob([sectionsToCsv(getValues('sections') as never)], { type: 'text/csv' }));
    Object.assign(document.createElement('a'), { href: url, download: `${detail.study.code}-sections.csv` }).click();
    URL.revokeObjectURL(url);
  }

  return (
    <form noValidate onSubmit={handleSubmit((v) => save.mutate(v))} className="space-y-4" aria-label="Study editor">
      <fieldset disabled={lock} className="space-y-4">
        <section className={box}>
          <h3 className="mb-2 font-semibold">General</h3>
          <div className="flex flex-wrap gap-3">
            <Field register={register} errors={errors} name="title" label="Title" type="text" className="w-80" />
            <label className="block text-xs"><span className="text-ink-soft">Frequency</span>
              <Controller control={control} name="frequencyHz" render={({ field }) => <select aria-label="Frequency" className="mt-0.5 block rounded border border-rule px-1 py-0.5" value={field.value} onChange={(e) => field.onChange(Number(e.target.value))}><option value={50}>50 Hz</option><option value={60}>60 Hz</option></select>} />
            </label>
            <Field register={register} errors={errors} name="soilResistivityOhmM" label="Soil resistivity (Ω·m)" />
            <Field register={register} errors={errors} name="earthing.routeStartOhm" label="Earth at route start (Ω)" />
            <Field register={register} errors={errors} name="earthing.routeEndOhm" label="Earth at route end (Ω)" />
            <Field register={register} errors={errors} name="earthing.linkBoxOhm" label="Earth at link boxes (Ω)" />
          </div>
        </section>

        <section className={box}>
          <h3 className="mb-2 font-semibold">Cable types</h3>
          {cableTypes.fields.map((f, i) => (
            <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2 border-b border-rule pb-2">
              <Field register={register} errors={errors} name={`cableTypes.${i}.id`} label="Id" type="text" className="w-16" />
              <Field register={register} errors={errors} name={`cableTypes.${i}.name`} label="Name" type="text" className="w-56" />
              <Field register={register} errors={errors} name={`cableTypes.${i}.conductorResistanceOhmPerKm`} label="Conductor R (Ω/km)" />
              <Field register={register} errors={errors} name={`cableTypes.${i}.conductorGmrMm`} label="Conductor GMR (mm)" />
              <Field register={register} errors={errors} name={`cableTypes.${i}.sheathMeanDiameterMm`} label="Sheath mean dia. (mm)" />
              <Field register={register} errors={errors} name={`cableTypes.${i}.sheathResistanceOhmPerKm`} label="Sheath R (Ω/km)" />
              <Field register={register} errors={errors} name={`cableTypes.${i}.oversheathThicknessMm`} label="Oversheath (mm)" />
              <Field register={register} errors={errors} name={`cableTypes.${i}.overallDiameterMm`} label="Overall dia. (mm)" />
              <Field register={register} errors={errors} name={`cableTypes.${i}.oversheathWithstandKv`} label="Oversheath withstand (kV)" />
              <Button tone="danger" onClick={() => cableTypes.remove(i)} disabled={cableTypes.fields.length === 1}>Remove</Button>
            </div>
          ))}
          <div className="flex flex-wrap items-end gap-2">
            <label className="text-xs"><span className="text-ink-soft">From the catalogue</span>
              <select aria-label="Cable type from the catalogue" className="mt-0.5 block rounded border border-rule px-1 py-0.5" value={fromCatalogue} onChange={(e) => setFromCatalogue(e.target.value)}>
                <option value="">choose…</option>
                {catalogue.data?.cableTypes.map((c) => <option key={c.id} value={c.code}>{c.code}: {c.data.name}</option>)}
              </select>
            </label>
            <Button tone="plain" disabled={!fromCatalogue} onClick={() => { const c = catalogue.data?.cableTypes.find((x) => x.code === fromCatalogue); if (c && !getValues('cableTypes').some((t) => t.id === c.code)) cableTypes.append(c.data); }}>Add to the study</Button>
          </div>
          <h4 className="mt-3 text-sm font-semibold">Circuits</h4>
          {circuits.fields.map((f, i) => (
            <div key={f.id} className="flex flex-wrap items-end gap-2">
              <Field register={register} errors={errors} name={`circuits.${i}.id`} label="Circuit id" type="text" className="w-16" readOnly />
              <Field register={register} errors={errors} name={`circuits.${i}.name`} label="Circuit name" type="text" className="w-56" />
              <label className="block text-xs"><span className="text-ink-soft">Cable type</span>
                <select aria-label={`Cable type of ${getValues(`circuits.${i}.id`)}`} {...register(`circuits.${i}.cableTypeId`)} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
                  {watch('cableTypes').map((t) => <option key={t.id} value={t.id}>{t.id}</option>)}
                </select>
                <FieldMessage errors={errors} name={`circuits.${i}.cableTypeId`} />
              </label>
            </div>
          ))}
        </section>

        <section className={box}>
          <h3 className="mb-2 font-semibold">Formation</h3>
          {layouts?.map((layout, li) => (
            <div key={layout.id} className="flex flex-wrap gap-6">
              <div className="space-y-2">
                <p className="text-sm font-semibold">Layout {layout.id}</p>
                {layout.circuits.map((c, ci) => (
                  <div key={ci} className="flex flex-wrap items-end gap-2">
                    <span className="text-sm">{c.circuitId}</span>
                    <label className="block text-xs"><span className="text-ink-soft">Formation</span>
                      <select aria-label="Formation" {...register(`layouts.${li}.circuits.${ci}.formation`)} className="mt-0.5 block rounded border border-rule px-1 py-0.5"><option value="trefoil">trefoil</option><option value="flat">flat</option></select>
                    </label>
                    {c.formation !== 'coordinates' && <>
                      <Field register={register} errors={errors} name={`layouts.${li}.circuits.${ci}.spacingM`} label="Spacing (m)" />
                      <Field register={register} errors={errors} name={`layouts.${li}.circuits.${ci}.depthM`} label="Depth (m)" />
                      <Field register={register} errors={errors} name={`layouts.${li}.circuits.${ci}.centreXM`} label="Offset (m)" />
                    </>}
                  </div>
                ))}
                <FieldMessage errors={errors} name={`layouts.${li}.circuits`} />
                {(layout.eccs ?? []).map((e, ei) => (
                  <div key={`${e.eccId}-${ei}`} className="flex flex-wrap items-end gap-2">
                    <span className="text-sm">ECC {e.eccId}</span>
                    <Field register={register} errors={errors} name={`layouts.${li}.eccs.${ei}.xM`} label="ECC x (m)" />
                    <Field register={register} errors={errors} name={`layouts.${li}.eccs.${ei}.depthM`} label="ECC depth (m)" />
                  </div>
                ))}
                {(watch('eccs') ?? []).filter((e) => !(layout.eccs ?? []).some((p) => p.eccId === e.id)).map((e) => (
                  <Button key={e.id} tone="plain" onClick={() => setValue(`layouts.${li}.eccs`, [...(getValues(`layouts.${li}.eccs`) ?? []), { eccId: e.id, xM: 0.5, depthM: 1.0 }], { shouldDirty: true })}>Place ECC {e.id} in this layout</Button>
                ))}
                <FieldMessage errors={errors} name={`layouts.${li}.eccs`} />
              </div>
              <CrossSectionSketch layout={layout} cableTypes={watch('cableTypes')} circuits={watch('circuits')} />
            </div>
          ))}
        </section>

        <section className={box}>
          <h3 className="mb-2 font-semibold">Route sections</h3>
          <table className="text-sm" data-testid="sections-table">
            <thead><tr className="text-left text-xs text-ink-soft"><th>#</th><th>Id</th><th>Length (m)</th><th>Layout</th><th>Cables shifted at start</th><th /></tr></thead>
            <tbody>
              {sections.fields.map((f, i) => (
                <tr key={f.id} className="align-top">
                  <td className="pr-2 text-ink-soft">{i + 1}</td>
                  <td><Field register={register} errors={errors} name={`sections.${i}.id`} label={`Section ${i + 1} id`} type="text" hideLabel className="w-16" /></td>
                  <td><Field register={register} errors={errors} name={`sections.${i}.lengthM`} label={`Section ${i + 1} length`} hideLabel /></td>
                  <td><Field register={register} errors={errors} name={`sections.${i}.layoutId`} label={`Section ${i + 1} layout`} type="text" hideLabel className="w-16" /></td>
                  <td>
                    <Controller control={control} name={`sections.${i}.phaseRotation`} render={({ field }) => <select aria-label={`Section ${i + 1} transposition`} className="mt-0.5 rounded border border-rule px-1" value={field.value ?? 0} onChange={(e) => field.onChange(Number(e.target.value))}><option value={0}>none</option><option value={1}>by 1</option><option value={2}>by 2</option></select>} />
                  </td>
                  <td className="space-x-1 whitespace-nowrap">
                    <Button tone="plain" onClick={() => splitSection(i)}>Split</Button>
                    <Button tone="plain" onClick={() => i > 0 && sections.move(i, i - 1)} disabled={i === 0}>↑</Button>
                    <Button tone="plain" onClick={() => i < sections.fields.length - 1 && sections.move(i, i + 1)} disabled={i === sections.fields.length - 1}>↓</Button>
                    <Button tone="danger" onClick={() => sections.remove(i)}>Remove</Button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <div className="mt-2 flex flex-wrap items-start gap-2">
            <Button tone="plain" onClick={() => sections.append({ id: `S${sections.fields.length + 1}`, lengthM: 500, layoutId: layouts?.[0]?.id ?? 'L1', phaseRotation: 0 })}>Add section</Button>
            <Button tone="plain" onClick={exportCsv}>Export CSV</Button>
            <Button tone="plain" onClick={() => fileInput.current?.click()}>Import CSV</Button>
            <input ref={fileInput} type="file" accept=".csv,text/csv" className="hidden" aria-label="CSV file of sections" onChange={async (e) => { const file = e.target.files?.[0]; if (file) replaceSections(await file.text()); e.target.value = ''; }} />
            <label className="text-xs">Paste from a spreadsheet (id, length, layout, shift; or lengths only)
              <textarea aria-label="Pasted sections" className="block w-72 rounded border border-rule px-1" rows={2} value={pasteText} onChange={(e) => setPasteText(e.target.value)} />
            </label>
            <Button tone="plain" onClick={() => replaceSections(pasteText)}>Use pasted rows</Button>
          </div>
          {pasteError && <p role="alert" className="text-sm text-fail">{pasteError}</p>}
          <FieldMessage errors={errors} name="sections" />
        </section>

        <section className={box}>
          <h3 className="mb-2 font-semibold">Bonding of the sheaths</h3>
          {groups.fields.map((f, i) => (
            <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2">
              <label className="block text-xs"><span className="text-ink-soft">Arrangement</span>
                <select aria-label={`Group ${i + 1} arrangement`} {...register(`bonding.${i}.kind`)} className="mt-0.5 block rounded border border-rule px-1 py-0.5"><option value="cross-bonded">cross-bonded major section</option><option value="single-point">single-point</option><option value="solid">solidly bonded</option></select>
              </label>
              <label className="block text-xs"><span className="text-ink-soft">Sections (ids, in order)</span>
                <Controller control={control} name={`bonding.${i}.sectionIds`} render={({ field }) => <input aria-label={`Group ${i + 1} sections`} className="mt-0.5 block w-56 rounded border border-rule px-1 py-0.5" defaultValue={(field.value ?? []).join(', ')} onBlur={(e) => field.onChange(e.target.value.split(/[\s,]+/).filter(Boolean))} />} />
                <FieldMessage errors={errors} name={`bonding.${i}.sectionIds`} />
              </label>
              {watch(`bonding.${i}.kind`) === 'single-point' && (
                <label className="block text-xs"><span className="text-ink-soft">Earthed at</span>
                  <select aria-label={`Group ${i + 1} earthed at`} {...register(`bonding.${i}.earthedAt` as never)} className="mt-0.5 block rounded border border-rule px-1 py-0.5"><option value="start">start</option><option value="middle">middle</option><option value="end">end</option></select>
                </label>
              )}
              <Button tone="danger" onClick={() => groups.remove(i)}>Remove</Button>
            </div>
          ))}
          <Button tone="plain" onClick={() => groups.append({ kind: 'cross-bonded', sectionIds: ids.slice(-3) })}>Add group</Button>
          <FieldMessage errors={errors} name="bonding" />
          <p className="mt-1 text-xs text-ink-soft">Sections in use: {ids.join(', ')}</p>
        </section>

        <section className={box}>
          <h3 className="mb-2 font-semibold">Earth continuity conductors</h3>
          {eccs.fields.map((f, i) => (
            <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2">
              <Field register={register} errors={errors} name={`eccs.${i}.id`} label="ECC id" type="text" className="w-16" />
              <Field register={register} errors={errors} name={`eccs.${i}.name`} label="ECC name" type="text" className="w-40" />
              <Field register={register} errors={errors} name={`eccs.${i}.resistanceOhmPerKm`} label="ECC R (Ω/km)" />
              <Field register={register} errors={errors} name={`eccs.${i}.gmrMm`} label="ECC GMR (mm)" />
              <Field register={register} errors={errors} name={`eccs.${i}.fromSectionId`} label="From section" type="text" className="w-16" />
              <Field register={register} errors={errors} name={`eccs.${i}.toSectionId`} label="To section" type="text" className="w-16" />
              <label className="text-xs"><input type="checkbox" {...register(`eccs.${i}.transposedAtMidpoint`)} /> crossed over mid-way</label>
              <Button tone="danger" onClick={() => eccs.remove(i)}>Remove</Button>
              <FieldMessage errors={errors} name={`eccs.${i}`} />
            </div>
          ))}
          <Button tone="plain" onClick={() => eccs.append({ id: `E${eccs.fields.length + 1}`, name: 'ECC', resistanceOhmPerKm: 0.06, gmrMm: 8.6, fromSectionId: ids[0], toSectionId: ids[ids.length - 1], transposedAtMidpoint: false })}>Add ECC</Button>
          <p className="mt-1 text-xs text-ink-soft">Give each ECC its position beside the cables under Formation.</p>
        </section>

        <section className={box}>
          <h3 className="mb-2 font-semibold">Sheath voltage limiters (SVLs)</h3>
          {svls.fields.map((f, i) => (
            <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2">
              <Field register={register} errors={errors} name={`svls.${i}.jointIndex`} label="At joint no." />
              <label className="block text-xs"><span className="text-ink-soft">Connection</span><select aria-label="SVL connection" {...register(`svls.${i}.connection`)} className="mt-0.5 block rounded border border-rule px-1 py-0.5"><option value="to-earth">to earth</option><option value="across-joint">across the joint</option></select></label>
              <Field register={register} errors={errors} name={`svls.${i}.continuousRatingV`} label="Continuous rating (V)" />
              <Field register={register} errors={errors} name={`svls.${i}.tovRatingV`} label="TOV capability (V)" />
              <Button tone="danger" onClick={() => svls.remove(i)}>Remove</Button>
            </div>
          ))}
          <Button tone="plain" onClick={() => svls.append({ jointIndex: 1, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000, conductingResistanceOhm: 0.5 })}>Add SVL</Button>
        </section>

        <section className={box}>
          <h3 className="mb-2 font-semibold">Cases</h3>
          {cases.fields.map((f, i) => {
            const kind = watch(`cases.${i}.kind`);
            return (
              <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2 border-b border-rule pb-2">
                <Field register={register} errors={errors} name={`cases.${i}.id`} label="Id" type="text" className="w-16" />
                <Field register={register} errors={errors} name={`cases.${i}.name`} label="Name" type="text" className="w-48" />
                <label className="block text-xs"><span className="text-ink-soft">Kind</span><select aria-label={`Case ${i + 1} kind`} {...register(`cases.${i}.kind`)} className="mt-0.5 block rounded border border-rule px-1 py-0.5"><option value="normal">normal load</option><option value="emergency">emergency load</option><option value="three-phase-fault">three-phase through fault</option><option value="earth-fault">phase-to-earth through fault</option></select></label>
                {kind === 'earth-fault' ? <>
                  <Field register={register} errors={errors} name={`cases.${i}.earthFault.circuitId`} label="Faulted circuit" type="text" className="w-16" />
                  <Field register={register} errors={errors} name={`cases.${i}.earthFault.phase`} label="Phase" type="text" className="w-10" />
                  <Field register={register} errors={errors} name={`cases.${i}.earthFault.currentA`} label="Fault current (A)" />
                </> : (watch(`cases.${i}.currents`) ?? []).map((_c, k) => <Field key={k} register={register} errors={errors} name={`cases.${i}.currents.${k}.currentA`} label={`${watch(`cases.${i}.currents.${k}.circuitId`)} current (A)`} />)}
                {(kind === 'three-phase-fault' || kind === 'earth-fault') && <Field register={register} errors={errors} name={`cases.${i}.durationS`} label="Duration (s)" />}
                <FieldMessage errors={errors} name={`cases.${i}.currents`} />
                <FieldMessage errors={errors} name={`cases.${i}.earthFault`} />
                <Button tone="danger" onClick={() => cases.remove(i)}>Remove</Button>
              </div>
            );
          })}
          <Button tone="plain" onClick={() => cases.append({ id: `K${cases.fields.length + 1}`, name: 'Earth fault', kind: 'earth-fault', durationS: 1, currents: [], earthFault: { circuitId: getValues('circuits.0.id'), phase: 'a', currentA: 20000, beyond: 'end' }, svlsConducting: false })}>Add earth-fault case</Button>
        </section>
      </fieldset>

      {!lock && (
        <div className="sticky bottom-0 flex flex-wrap items-center gap-3 border-t border-rule bg-paper py-3">
          <Button type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : 'Save inputs'}</Button>
          <Button tone="plain" disabled={calculate.isPending || isDirty} onClick={() => calculate.mutate()}>{calculate.isPending ? 'Calculating…' : 'Calculate'}</Button>
          {calculate.isPending && <Busy label="Solving every case…" />}
          {isDirty && <span className="text-sm text-caution" data-testid="unsaved">Unsaved changes: save before calculating.</span>}
          {!isDirty && r.results && r.resultsInputsHash === r.inputsHash && <span className="text-sm text-pass" data-testid="calculated">Results are current for these inputs: see the results and the checklist.</span>}
          {!isDirty && r.results && r.resultsInputsHash !== r.inputsHash && <span className="text-sm text-caution">Inputs changed since the last calculation: calculate again.</span>}
          {Object.keys(errors).length > 0 && <span className="text-sm text-fail" role="alert">Some fields need correcting (marked in red).</span>}
          <ErrorNote error={save.error ?? calculate.error} />
        </div>
      )}
    </form>
  );
}
