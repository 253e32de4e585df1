import { useFormContext } from 'react-hook-form';
import { bondingLeadImpedance } from '../../lib/calc/bonding/bonding-lead';
import DerivationTable from '../ui/DerivationTable';
import { ErrorBeside, Num } from './fields';

type Way = 'total' | 'length';

/**
 * Each cross-bonding lead's impedance, one way only: a total, or its length with per-metre
 * figures, where a blank resistance per metre is derived from the lead's conductor.
 */
export default function BondingLeadFields() {
  const { watch, setValue } = useFormContext();
  const byLength = watch('bondingLeadLength');
  const leads = watch('bondingLeads');
  const initialC = watch('adiabatic.initialC');
  const way: Way = byLength ? 'length' : 'total';

  function choose(next: Way) {
    if (next === way) return;
    setValue('bondingLeadLength', next === 'length' ? { lengthM: 5 } : undefined, { shouldDirty: true });
    setValue('bondingLeadMilliohm', next === 'total' ? { r: 0, x: 0 } : undefined, { shouldDirty: true, shouldValidate: true });
  }

  const derivable = byLength && byLength.resistanceMilliohmPerM === undefined && leads && Number(leads.crossSectionMm2) > 0 && Number(byLength.lengthM) > 0 && Number.isFinite(Number(initialC ?? 50));
  const derived = derivable
    ? bondingLeadImpedance({ bondingLeadLength: byLength, bondingLeads: { crossSectionMm2: Number(leads.crossSectionMm2), material: leads.material ?? 'copper' }, adiabatic: { initialC: Number(initialC ?? 50), finalC: 160 } })
    : null;

  return (
    <div className="w-full">
      <div className="flex flex-wrap items-end gap-3">
        <label className="block text-xs">
          <span className="text-ink-soft">Lead impedance given as</span>
          <select aria-label="Lead impedance given as" value={way} onChange={(e) => choose(e.target.value as Way)} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
            <option value="total">a total per lead</option>
            <option value="length">length × per-metre figures</option>
          </select>
        </label>
        {way === 'total' && <>
          <Num name="bondingLeadMilliohm.r" label="Lead resistance (mΩ)" />
          <Num name="bondingLeadMilliohm.x" label="Lead reactance (mΩ)" />
        </>}
        {way === 'length' && <>
          <Num name="bondingLeadLength.lengthM" label="Lead length (m)" />
          <Num name="bondingLeadLength.resistanceMilliohmPerM" label="Lead resistance per metre (mΩ/m; blank: from the cross-section)" width="w-28" />
          <Num name="bondingLeadLength.reactanceMilliohmPerM" label="Lead reactance per metre (mΩ/m; blank: 0)" width="w-28" />
        </>}
        <ErrorBeside name="bondingLeadMilliohm" />
        <ErrorBeside name="bondingLeadLength" />
      </div>
      {derived && (
        <DerivationTable className="mt-2" figures={derived.figures} caption="Lead impedance derived from the cross-section and material given for the leads' fault-current check" testId="lead-derivation" />
      )}
    </div>
  );
}

