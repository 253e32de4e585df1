import { useFormContext } from 'react-hook-form';
import { Choice, Num, StudyBasics, box } from './fields';
import BondingLeadFields from './BondingLeadFields';

/** Study-wide data: frequency, soil, electrodes, bonding leads, touch-voltage ground, adiabatic temperatures. */
export default function GeneralSection() {
  const { watch, setValue, getValues, trigger } = useFormContext();
  const leads = watch('bondingLeads');
  const surface = watch('touch.surfaceLayer');
  return (
    <section className={box} aria-label="General">
      <h3 className="mb-2 font-semibold">General</h3>
      <StudyBasics />
      <h4 className="mt-3 text-sm font-semibold">Electrodes (study-wide; per joint on the route strip below)</h4>
      <div className="flex flex-wrap gap-3">
        <Num name="earthing.routeStartOhm" label="Earth at route start (Ω)" />
        <Num name="earthing.routeEndOhm" label="Earth at route end (Ω)" />
        <Num name="earthing.linkBoxOhm" label="Earth at link boxes (Ω)" />
      </div>
      <h4 className="mt-3 text-sm font-semibold">Bonding leads</h4>
      <div className="flex flex-wrap items-end gap-3">
        <BondingLeadFields />
        <label className="flex items-center gap-1 text-xs">
          <input type="checkbox" aria-label="Check the leads' fault current" checked={!!leads} onChange={(e) => {
            setValue('bondingLeads', e.target.checked ? { crossSectionMm2: 240, material: 'copper' } : undefined, { shouldDirty: true });
            // A lead given by length may take its resistance from this conductor: its error is re-judged.
            if (getValues('bondingLeadLength')) void trigger('bondingLeadLength');
          }} /> Check the leads' fault current
        </label>
        {leads && <>
          <Num name="bondingLeads.crossSectionMm2" label="Lead cross-section (mm²)" />
          <Choice name="bondingLeads.material" label="Lead material" options={[['copper', 'copper'], ['aluminium', 'aluminium']]} />
        </>}
        <Num name="adiabatic.initialC" label="Initial temperature (°C)" />
        <Num name="adiabatic.finalC" label="Final temperature (°C)" />
      </div>
      <h4 className="mt-3 text-sm font-semibold">Touch voltage at link boxes and route ends</h4>
      <div className="flex flex-wrap items-end gap-3">
        <Choice name="touch.bodyWeightKg" label="Body weight" numeric options={[[50, '50 kg'], [70, '70 kg']]} />
        <label className="flex items-center gap-1 text-xs">
          <input type="checkbox" aria-label="Surface layer" checked={!!surface} onChange={(e) => setValue('touch.surfaceLayer', e.target.checked ? { resistivityOhmM: 3000, thicknessM: 0.1 } : undefined, { shouldDirty: true })} /> Surface layer (e.g. crushed rock)
        </label>
        {surface && <>
          <Num name="touch.surfaceLayer.resistivityOhmM" label="Surface layer resistivity (Ω·m)" />
          <Num name="touch.surfaceLayer.thicknessM" label="Surface layer thickness (m)" />
        </>}
      </div>
    </section>
  );
}
