import { useFieldArray, useFormContext } from 'react-hook-form';
import { Button } from '../ui/parts';
import { Choice, ErrorBeside, Num, Text, box } from './fields';
import EccCrossings from './EccCrossings';
import { nextId } from './LayoutsSection';

/** Earth continuity conductors: the run along the route, and the cross-over that transposes them. */
export default function EccsSection() {
  const { control, watch, getValues, setValue } = useFormContext();
  const eccs = useFieldArray({ control, name: 'eccs' });
  const ids: string[] = (watch('sections') ?? []).map((s: { id: string }) => s.id);
  const sectionOptions = ids.map((id): [string, string] => [id, id]);
  return (
    <section className={box} aria-label="Earth continuity conductors">
      <h3 className="mb-2 font-semibold">Earth continuity conductors (ECCs)</h3>
      {eccs.fields.map((f, i) => {
        const id = watch(`eccs.${i}.id`);
        return (
          <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2 border-b border-rule pb-2">
            <Text name={`eccs.${i}.id`} label={`Id of ECC ${i + 1}`} width="w-16" />
            <Text name={`eccs.${i}.name`} label={`Name of ECC ${id}`} width="w-40" />
            <Num name={`eccs.${i}.resistanceOhmPerKm`} label={`Resistance of ECC ${id} (Ω/km)`} />
            <Num name={`eccs.${i}.gmrMm`} label={`GMR of ECC ${id} (mm)`} />
            <Choice name={`eccs.${i}.fromSectionId`} label={`ECC ${id} from section`} options={sectionOptions} />
            <Choice name={`eccs.${i}.toSectionId`} label={`ECC ${id} to section`} options={sectionOptions} />
            <EccCrossings i={i} />
            <Num name={`eccs.${i}.crossSectionMm2`} label={`Cross-section of ECC ${id} (mm², for the fault check)`} />
            <Choice name={`eccs.${i}.material`} label={`Material of ECC ${id}`} options={[['copper', 'copper'], ['aluminium', 'aluminium']]} />
            <Button tone="danger" onClick={() => {
              eccs.remove(i);
              setValue('layouts', getValues('layouts').map((l: { eccs?: Array<{ eccId: string }> }) => ({ ...l, eccs: (l.eccs ?? []).filter((p) => p.eccId !== id) })), { shouldDirty: true });
            }}>Remove ECC {id}</Button>
            <ErrorBeside name={`eccs.${i}`} />
          </div>
        );
      })}
      <Button tone="plain" onClick={() => {
        const id = nextId(getValues('eccs') ?? [], 'E');
        eccs.append({ id, name: 'ECC', resistanceOhmPerKm: 0.0754, gmrMm: 8.6, fromSectionId: ids[0], toSectionId: ids[ids.length - 1], transposedAtMidpoint: false, material: 'copper' });
        // Give it a place in every layout, beside the first circuit; the person moves it.
        setValue('layouts', getValues('layouts').map((l: { eccs?: unknown[] }) => ({ ...l, eccs: [...(l.eccs ?? []), { eccId: id, xM: 0.5, depthM: 1.0 }] })), { shouldDirty: true });
      }}>Add ECC</Button>
      <ErrorBeside name="eccs" />
      <p className="mt-1 text-xs text-ink-soft">Each new ECC is placed 0.5 m beside the cables at 1 m depth in every layout: set its position under Formation.</p>
    </section>
  );
}
