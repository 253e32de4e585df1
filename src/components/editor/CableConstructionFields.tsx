import { useFormContext } from 'react-hook-form';
import { conductorMetals, sheathMetals, SHEATH_METALS } from '../../lib/calc/cable/materials';
import { strandCounts, strandings } from '../../lib/calc/cable/conductor';
import { cableConstructionSchema } from '../../lib/schemas/bonding-study.schema';
import CableDerivation from '../admin/cable/CableDerivation';
import { Choice, ErrorBeside, Num } from './fields';

/** The engine figures a construction entry derives; stored with it, and dropped when the construction changes so they are derived again. */
export const DERIVED_FIGURES = ['conductorResistanceOhmPerKm', 'conductorGmrMm', 'sheathMeanDiameterMm', 'sheathResistanceOhmPerKm'] as const;

/** A starting construction, to be replaced by the cable's own (illustrative: 132 kV, 1000 mm² copper, lead sheath). */
export const STARTING_CONSTRUCTION = {
  frequencyHz: 50,
  conductor: { material: 'copper', crossSectionMm2: 1000, diameterMm: 38, stranding: 'segmental', segmentCount: 5, operatingTemperatureC: 90 },
  screen: { kind: 'tubular', material: 'lead', meanDiameterMm: 90, thicknessMm: 2.5, operatingTemperatureC: 70 },
};

/**
 * The construction of study cable type `i`, edited in the study: every change drops the
 * derived figures, which the schema derives again (with their working shown below).
 */
export default function CableConstructionFields({ i }: { i: number }) {
  const { watch, setValue, getValues } = useFormContext();
  const at = `cableTypes.${i}.construction`;
  const stranding = watch(`${at}.conductor.stranding`);
  const screenKind = watch(`${at}.screen.kind`);
  const construction = watch(at);
  const parsed = cableConstructionSchema.safeParse(construction);

  // Any edit inside the construction makes the stored derived figures stale.
  const onEdit = () => {
    for (const key of DERIVED_FIGURES) if (getValues(`cableTypes.${i}.${key}`) !== undefined) setValue(`cableTypes.${i}.${key}`, undefined, { shouldDirty: true });
  };
  const c = `${at}.conductor`;
  const s = `${at}.screen`;
  // A new stranding or screen kind keeps only the fields that apply to it (the schema is strict).
  function chooseStranding(next: string) {
    const { strandCount: _s, segmentCount: _g, ...rest } = getValues(c) ?? {};
    setValue(c, { ...rest, stranding: next, ...(next === 'stranded' ? { strandCount: 61 } : next === 'segmental' ? { segmentCount: 5 } : {}) }, { shouldDirty: true, shouldValidate: true });
    onEdit();
  }
  function chooseScreen(next: string) {
    const temperature = getValues(`${s}.operatingTemperatureC`) ?? 70;
    setValue(s, next === 'wires'
      ? { kind: 'wires', material: 'copper', wireCount: 60, wireDiameterMm: 1.5, diameterUnderWiresMm: 90, operatingTemperatureC: temperature }
      : { ...STARTING_CONSTRUCTION.screen, operatingTemperatureC: temperature }, { shouldDirty: true, shouldValidate: true });
    onEdit();
  }
  const id = watch(`cableTypes.${i}.id`);
  return (
    <div className="w-full space-y-2" onChangeCapture={onEdit} data-testid={`construction-${i}`}>
      <fieldset className="flex flex-wrap items-end gap-2">
        <legend className="text-xs font-semibold">Conductor of {id}</legend>
        <Choice name={`${c}.material`} label={`Conductor metal of ${id}`} options={conductorMetals.map((m) => [m, m])} />
        <Num name={`${c}.crossSectionMm2`} label={`Conductor cross-section of ${id} (mm²)`} />
        <Num name={`${c}.diameterMm`} label={`Conductor diameter of ${id} (mm)`} />
        <label className="block text-xs">
          <span className="text-ink-soft">Stranding of {id}</span>
          <select aria-label={`Stranding of ${id}`} value={stranding ?? 'stranded'} onChange={(e) => chooseStranding(e.target.value)} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
            {strandings.map((m) => <option key={m} value={m}>{m === 'segmental' ? 'segmental (Milliken)' : m}</option>)}
          </select>
        </label>
        {stranding === 'stranded' && <Choice name={`${c}.strandCount`} label={`Strands of ${id}`} numeric options={strandCounts.map((n) => [n, String(n)])} />}
        {stranding === 'segmental' && <Choice name={`${c}.segmentCount`} label={`Segments of ${id}`} numeric options={[4, 5, 6].map((n) => [n, String(n)])} />}
        <Num name={`${c}.resistance20OhmPerKm`} label={`Conductor R at 20 °C of ${id}, optional (Ω/km)`} width="w-28" />
        <Num name={`${c}.operatingTemperatureC`} label={`Conductor temperature of ${id} (°C)`} />
        <Choice name={`${at}.frequencyHz`} label={`Frequency for the skin effect of ${id}`} numeric options={[[50, '50 Hz'], [60, '60 Hz']]} />
      </fieldset>
      <fieldset className="flex flex-wrap items-end gap-2">
        <legend className="text-xs font-semibold">Metallic sheath or screen of {id}</legend>
        <label className="block text-xs">
          <span className="text-ink-soft">Screen kind of {id}</span>
          <select aria-label={`Screen kind of ${id}`} value={screenKind ?? 'tubular'} onChange={(e) => chooseScreen(e.target.value)} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
            <option value="tubular">sheath (tube)</option>
            <option value="wires">wire screen</option>
          </select>
        </label>
        {screenKind === 'wires' ? (
          <>
            <Choice name={`${s}.material`} label={`Wire metal of ${id}`} options={[['copper', 'copper'], ['aluminium', 'aluminium']]} />
            <Num name={`${s}.wireCount`} label={`Screen wires of ${id}`} />
            <Num name={`${s}.wireDiameterMm`} label={`Screen wire diameter of ${id} (mm)`} />
            <Num name={`${s}.diameterUnderWiresMm`} label={`Diameter under the wires of ${id} (mm)`} />
            <Num name={`${s}.layLengthMm`} label={`Lay length of ${id}, optional (mm)`} width="w-28" />
          </>
        ) : (
          <>
            <Choice name={`${s}.material`} label={`Sheath metal of ${id}`} options={sheathMetals.map((m) => [m, SHEATH_METALS[m].label])} />
            <Num name={`${s}.meanDiameterMm`} label={`Sheath mean diameter of ${id} (mm)`} />
            <Num name={`${s}.thicknessMm`} label={`Sheath thickness of ${id} (mm)`} />
          </>
        )}
        <Num name={`${s}.operatingTemperatureC`} label={`Screen temperature of ${id} (°C)`} />
      </fieldset>
      {DERIVED_FIGURES.map((key) => <ErrorBeside key={key} name={`cableTypes.${i}.${key}`} />)}
      <ErrorBeside name={at} />
      {parsed.success && <CableDerivation construction={parsed.data} caption={`Engine figures of ${id}, derived from its construction`} />}
    </div>
  );
}
