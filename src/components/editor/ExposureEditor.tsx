import { useFieldArray, useFormContext } from 'react-hook-form';
import { exposureStudySchema } from '../../lib/schemas/exposure-study.schema';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { Button } from '../ui/parts';
import StudyForm from './StudyForm';
import { Choice, ErrorBeside, Num, StudyBasics, Text, box } from './fields';
import { nextId } from './LayoutsSection';

/** The form of an exposure study: the inducing conductors, the parallel metalwork, its earthing and screening, the cases and the touch-voltage ground. */
export default function ExposureEditor({ detail, readOnly }: { detail: RevisionDetail; readOnly: boolean }) {
  return (
    <StudyForm detail={detail} readOnly={readOnly} schema={exposureStudySchema}>
      {() => (
        <>
          <section className={box} aria-label="General">
            <h3 className="mb-2 font-semibold">General</h3>
            <StudyBasics />
          </section>
          <Sources />
          <Metalwork />
          <ExposureCases />
          <Touch />
        </>
      )}
    </StudyForm>
  );
}

function Sources() {
  const { control, getValues, setValue } = useFormContext();
  const sources = useFieldArray({ control, name: 'sources' });
  return (
    <section className={box} aria-label="Source conductors">
      <h3 className="mb-2 font-semibold">Conductors carrying the inducing currents</h3>
      <p className="mb-1 text-xs text-ink-soft">x across the corridor; y is height above ground (negative when buried).</p>
      {sources.fields.map((f, i) => (
        <div key={f.id} className="flex flex-wrap items-end gap-2">
          <Text name={`sources.${i}.id`} label={`Id of source ${i + 1}`} width="w-16" />
          <Text name={`sources.${i}.name`} label={`Name of source ${i + 1}`} width="w-48" />
          <Num name={`sources.${i}.xM`} label={`x of source ${i + 1} (m)`} />
          <Num name={`sources.${i}.yM`} label={`Height of source ${i + 1} (m)`} />
          <Button tone="danger" disabled={sources.fields.length === 1} onClick={() => {
            const id = getValues(`sources.${i}.id`);
            sources.remove(i);
            setValue('cases', getValues('cases').map((c: { currents: Array<{ sourceId: string }> }) => ({ ...c, currents: c.currents.filter((x) => x.sourceId !== id) })), { shouldDirty: true });
          }}>Remove source {i + 1}</Button>
        </div>
      ))}
      <Button tone="plain" onClick={() => sources.append({ id: nextId(getValues('sources'), 'P'), name: '', xM: 0, yM: 10 })}>Add source</Button>
      <ErrorBeside name="sources" />
    </section>
  );
}

function Metalwork() {
  const { watch } = useFormContext();
  const pipeline = watch('object.type') === 'pipeline';
  const earthing = watch('object.earthing');
  return (
    <section className={box} aria-label="The parallel metalwork">
      <h3 className="mb-2 font-semibold">The parallel metalwork</h3>
      <div className="flex flex-wrap items-end gap-3">
        <Text name="object.name" label="Name of the metalwork" width="w-56" />
        <Choice name="object.type" label="Type of metalwork" options={[['fence', 'fence'], ['pipeline', 'pipeline'], ['telecom-cable', 'telecom cable'], ['pilot-cable', 'pilot cable'], ['other', 'other']]} />
        <Num name="object.xM" label="x of the metalwork (m)" />
        <Num name="object.yM" label="Height of the metalwork (m)" />
        <Num name="object.parallelLengthM" label="Length of parallelism (m)" />
        <Num name="object.resistanceOhmPerKm" label="Resistance of the metalwork (Ω/km)" />
        <Num name="object.gmrMm" label="GMR of the metalwork (mm)" />
      </div>
      <div className="mt-2 flex flex-wrap items-end gap-3">
        <Choice name="object.earthing" label="Earthed at" options={[['both-ends', 'both ends'], ['start', 'the start only'], ['end', 'the end only']]} />
        {earthing !== 'end' && <Num name="object.earthStartOhm" label="Earth resistance at the start (Ω)" />}
        {earthing !== 'start' && <Num name="object.earthEndOhm" label="Earth resistance at the end (Ω)" />}
        <Num name="object.screeningFactor" label="Screening factor (1: none)" />
        {pipeline && <Num name="object.coatingDefectDiameterMm" label="Coating defect diameter (mm)" />}
      </div>
    </section>
  );
}

function ExposureCases() {
  const { control, watch, getValues, setValue } = useFormContext();
  const cases = useFieldArray({ control, name: 'cases' });
  const sourceIds: string[] = (watch('sources') ?? []).map((s: { id: string }) => s.id);
  return (
    <section className={box} aria-label="Cases">
      <h3 className="mb-2 font-semibold">Cases</h3>
      {cases.fields.map((f, i) => {
        const c = watch(`cases.${i}`) ?? {};
        const who = c.id || String(i + 1);
        return (
          <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2 border-b border-rule pb-2">
            <Text name={`cases.${i}.id`} label={`Id of case ${i + 1}`} width="w-16" />
            <Text name={`cases.${i}.name`} label={`Name of case ${who}`} width="w-48" />
            <Choice name={`cases.${i}.kind`} label={`Kind of case ${who}`} options={[['normal', 'normal load'], ['fault', 'fault']]} />
            {c.kind === 'fault' && <Num name={`cases.${i}.durationS`} label={`Duration of case ${who} (s)`} />}
            {(c.currents ?? []).map((cur: { sourceId: string }, k: number) => (
              <span key={k} className="flex items-end gap-1">
                <Num name={`cases.${i}.currents.${k}.currentA`} label={`Current in ${cur.sourceId}, case ${who} (A)`} />
                <Num name={`cases.${i}.currents.${k}.angleDeg`} label={`Angle in ${cur.sourceId}, case ${who} (°)`} width="w-16" />
              </span>
            ))}
            {sourceIds.filter((id) => !(c.currents ?? []).some((x: { sourceId: string }) => x.sourceId === id)).map((id) => (
              <Button key={id} tone="plain" onClick={() => setValue(`cases.${i}.currents`, [...(c.currents ?? []), { sourceId: id, currentA: 0, angleDeg: 0 }], { shouldDirty: true })}>Give {id} a current</Button>
            ))}
            <Button tone="danger" disabled={cases.fields.length === 1} onClick={() => cases.remove(i)}>Remove case {who}</Button>
            <ErrorBeside name={`cases.${i}.currents`} />
          </div>
        );
      })}
      <Button tone="plain" onClick={() => cases.append({ id: nextId(getValues('cases'), 'K'), name: 'New case', kind: 'fault', durationS: 0.5, currents: sourceIds.map((id) => ({ sourceId: id, currentA: 1000, angleDeg: 0 })) })}>Add case</Button>
      <ErrorBeside name="cases" />
    </section>
  );
}

function Touch() {
  const { watch, setValue } = useFormContext();
  const surface = watch('touch.surfaceLayer');
  return (
    <section className={box} aria-label="Touch voltage">
      <h3 className="mb-2 font-semibold">Where people touch the metalwork</h3>
      <div className="flex flex-wrap items-end gap-3">
        <Choice name="touch.bodyWeightKg" label="Body weight" numeric options={[[50, '50 kg'], [70, '70 kg']]} />
        <label className="flex items-center gap-1 text-xs">
          <input type="checkbox" aria-label="Surface layer" checked={!!surface} onChange={(e) => setValue('touch.surfaceLayer', e.target.checked ? { resistivityOhmM: 3000, thicknessM: 0.1 } : undefined, { shouldDirty: true })} /> Surface layer
        </label>
        {surface && <>
          <Num name="touch.surfaceLayer.resistivityOhmM" label="Surface layer resistivity (Ω·m)" />
          <Num name="touch.surfaceLayer.thicknessM" label="Surface layer thickness (m)" />
        </>}
      </div>
    </section>
  );
}
