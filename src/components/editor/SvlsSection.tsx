import { useFieldArray, useFormContext } from 'react-hook-form';
import { Button } from '../ui/parts';
import { Choice, ErrorBeside, Num, box } from './fields';
import { jointOptions } from './joints';

/** Sheath voltage limiters at joints, with the maker's ratings. */
export default function SvlsSection() {
  const { control, watch } = useFormContext();
  const svls = useFieldArray({ control, name: 'svls' });
  const joints = jointOptions(watch('sections') ?? [], watch('jointNames'));
  return (
    <section className={box} aria-label="Sheath voltage limiters">
      <h3 className="mb-2 font-semibold">Sheath voltage limiters (SVLs)</h3>
      {svls.fields.map((f, i) => (
        <div key={f.id} className="mb-2 flex flex-wrap items-end gap-2 border-b border-rule pb-2">
          <Choice name={`svls.${i}.jointIndex`} label={`Joint of SVL ${i + 1}`} numeric options={joints} />
          <Choice name={`svls.${i}.connection`} label={`Connection of SVL ${i + 1}`} options={[['to-earth', 'each sheath to earth'], ['across-joint', 'across the joint']]} />
          <Num name={`svls.${i}.continuousRatingV`} label={`Continuous rating of SVL ${i + 1} (V)`} />
          <Num name={`svls.${i}.tovRatingV`} label={`TOV capability of SVL ${i + 1} (V)`} />
          <Num name={`svls.${i}.conductingResistanceOhm`} label={`Resistance of SVL ${i + 1} when conducting (Ω)`} />
          <Num name={`svls.${i}.energyRatingKJ`} label={`Energy rating of SVL ${i + 1} (kJ)`} />
          <Button tone="danger" onClick={() => svls.remove(i)}>Remove SVL {i + 1}</Button>
        </div>
      ))}
      <Button tone="plain" onClick={() => svls.append({ jointIndex: 1, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000, conductingResistanceOhm: 0.5 })}>Add SVL</Button>
      <ErrorBeside name="svls" />
    </section>
  );
}
