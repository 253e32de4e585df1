import { useState } from 'react';
import type { FieldErrors, UseFormRegister, UseFormWatch } from 'react-hook-form';
import { conductorMetals, sheathMetals, SHEATH_METALS } from '../../../lib/calc/cable/materials';
import { strandCounts, strandings } from '../../../lib/calc/cable/conductor';
import { Field, FieldMessage } from '../../editor/form-fields';

// Loose on purpose: the form holds either kind of cable type.
type AnyForm = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

function Choice({ register, errors, name, label, options, asNumber }: { register: UseFormRegister<AnyForm>; errors: FieldErrors; name: string; label: string; options: ReadonlyArray<readonly [string | number, string]>; asNumber?: boolean }) {
  return (
    <label className="block text-xs">
      <span className="text-ink-soft">{label}</span>
      <select aria-label={label} {...register(name, asNumber ? { setValueAs: (v: string) => (v === '' ? undefined : Number(v)) } : {})} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
        {options.map(([v, l]) => <option key={v} value={v}>{l}</option>)}
      </select>
      <FieldMessage errors={errors} name={name} />
    </label>
  );
}

/** Inputs of a cable's construction; fields that do not apply are not shown (and so not sent). */
export default function ConstructionFields({ register, errors, watch }: { register: UseFormRegister<AnyForm>; errors: FieldErrors; watch: UseFormWatch<AnyForm> }) {
  const [withFoil, setWithFoil] = useState(false);
  const stranding = watch('construction.conductor.stranding');
  const screenKind = watch('construction.screen.kind');
  const c = 'construction.conductor';
  const s = 'construction.screen';
  return (
    <div className="w-full space-y-2">
      <fieldset className="flex flex-wrap items-end gap-2">
        <legend className="text-xs font-semibold">Conductor</legend>
        <Choice register={register} errors={errors} name={`${c}.material`} label="Conductor metal" options={conductorMetals.map((m) => [m, m])} />
        <Field register={register} errors={errors} name={`${c}.crossSectionMm2`} label="Cross-section (mm²)" />
        <Field register={register} errors={errors} name={`${c}.diameterMm`} label="Conductor dia. (mm)" />
        <Choice register={register} errors={errors} name={`${c}.stranding`} label="Stranding" options={strandings.map((m) => [m, m === 'segmental' ? 'segmental (Milliken)' : m])} />
        {stranding === 'stranded' && <Choice register={register} errors={errors} name={`${c}.strandCount`} label="Strands" asNumber options={strandCounts.map((n) => [n, String(n)])} />}
        {stranding === 'segmental' && <Choice register={register} errors={errors} name={`${c}.segmentCount`} label="Segments" asNumber options={[4, 5, 6].map((n) => [n, String(n)])} />}
        <Field register={register} errors={errors} name={`${c}.resistance20OhmPerKm`} label="R at 20 °C, optional (Ω/km)" className="w-28" />
        <Field register={register} errors={errors} name={`${c}.operatingTemperatureC`} label="Conductor temp. (°C)" />
        <Choice register={register} errors={errors} name="construction.frequencyHz" label="Frequency" asNumber options={[[50, '50 Hz'], [60, '60 Hz']]} />
      </fieldset>
      <fieldset className="flex flex-wrap items-end gap-2">
        <legend className="text-xs font-semibold">Metallic sheath or screen</legend>
        <Choice register={register} errors={errors} name={`${s}.kind`} label="Screen kind" options={[['tubular', 'sheath (tube)'], ['wires', 'wire screen']]} />
        {screenKind === 'wires' ? (
          <>
            <Choice register={register} errors={errors} name={`${s}.material`} label="Wire metal" options={[['copper', 'copper'], ['aluminium', 'aluminium']]} />
            <Field register={register} errors={errors} name={`${s}.wireCount`} label="Wires" />
            <Field register={register} errors={errors} name={`${s}.wireDiameterMm`} label="Wire dia. (mm)" />
            <Field register={register} errors={errors} name={`${s}.diameterUnderWiresMm`} label="Dia. under wires (mm)" />
            <Field register={register} errors={errors} name={`${s}.layLengthMm`} label="Lay length, optional (mm)" className="w-28" />
            <label className="flex items-center gap-1 text-xs"><input type="checkbox" checked={withFoil} onChange={(e) => setWithFoil(e.target.checked)} /> Foil or tape over the wires</label>
            {withFoil && (
              <>
                <Choice register={register} errors={errors} name={`${s}.foil.material`} label="Foil metal" options={[['aluminium', 'aluminium'], ['copper', 'copper']]} />
                <Field register={register} errors={errors} name={`${s}.foil.thicknessMm`} label="Foil thickness (mm)" />
              </>
            )}
          </>
        ) : (
          <>
            <Choice register={register} errors={errors} name={`${s}.material`} label="Sheath metal" options={sheathMetals.map((m) => [m, SHEATH_METALS[m].label])} />
            <Field register={register} errors={errors} name={`${s}.meanDiameterMm`} label="Sheath mean dia. (mm)" />
            <Field register={register} errors={errors} name={`${s}.thicknessMm`} label="Sheath thickness (mm)" />
          </>
        )}
        <Field register={register} errors={errors} name={`${s}.operatingTemperatureC`} label="Screen temp. (°C)" />
      </fieldset>
    </div>
  );
}
