import { useEffect, useState } from 'react';
import { Controller, useFieldArray, useFormContext } from 'react-hook-form';
import { Button } from '../ui/parts';
import { Choice, ErrorBeside, box } from './fields';

/** Bonding groups: each a run of sections bonded one way. */
export default function BondingSection() {
  const { control, watch } = useFormContext();
  const groups = useFieldArray({ control, name: 'bonding' });
  const ids: string[] = (watch('sections') ?? []).map((s: { id: string }) => s.id);
  return (
    <section className={box} aria-label="Bonding of the sheaths">
      <h3 className="mb-2 font-semibold">Bonding of the sheaths</h3>
      {groups.fields.map((f, i) => (
        <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2">
          <Choice name={`bonding.${i}.kind`} label={`Arrangement of group ${i + 1}`} options={[['cross-bonded', 'cross-bonded major section'], ['single-point', 'single-point'], ['solid', 'solidly bonded']]} />
          <label className="block text-xs" data-field={`bonding.${i}.sectionIds`}><span className="text-ink-soft">Sections (ids, in order)</span>
            <Controller control={control} name={`bonding.${i}.sectionIds`} render={({ field }) => <IdList label={`Sections of group ${i + 1}`} value={field.value ?? []} onChange={field.onChange} />} />
            <ErrorBeside name={`bonding.${i}.sectionIds`} />
          </label>
          {watch(`bonding.${i}.kind`) === 'single-point' && <Choice name={`bonding.${i}.earthedAt`} label={`Group ${i + 1} earthed at`} options={[['start', 'start'], ['middle', 'middle'], ['end', 'end']]} />}
          <Button tone="danger" onClick={() => groups.remove(i)}>Remove group {i + 1}</Button>
          <ErrorBeside name={`bonding.${i}`} />
        </div>
      ))}
      <Button tone="plain" onClick={() => groups.append({ kind: 'cross-bonded', sectionIds: ids.slice(-3) })}>Add group</Button>
      <ErrorBeside name="bonding" />
      <p className="mt-1 text-xs text-ink-soft">Sections in use: {ids.join(', ')}</p>
    </section>
  );
}

/** Ids typed as "S1, S2, S3"; follows the form when the list changes elsewhere (split, remove). */
function IdList({ label, value, onChange }: { label: string; value: string[]; onChange: (ids: string[]) => void }) {
  const joined = value.join(', ');
  const [text, setText] = useState(joined);
  useEffect(() => setText(joined), [joined]);
  return <input aria-label={label} className="mt-0.5 block w-64 rounded border border-rule px-1 py-0.5" value={text} onChange={(e) => setText(e.target.value)} onBlur={() => onChange(text.split(/[\s,;]+/).filter(Boolean))} />;
}
