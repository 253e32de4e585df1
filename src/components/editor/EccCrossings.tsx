import { useFormContext } from 'react-hook-form';
import { ErrorBeside } from './fields';
import { jointOptions } from './joints';

type Crossing = 'none' | 'middle' | 'joints';

/**
 * Where ECC `i` crosses to its mirror position: nowhere, at the middle of its run (by
 * chainage), or at joints inside its run, ticked one by one. With no joint ticked it crosses
 * nowhere (the schema stores it as not transposed), and the form says so beside the choice.
 */
export default function EccCrossings({ i }: { i: number }) {
  const { watch, setValue } = useFormContext();
  const id: string = watch(`eccs.${i}.id`);
  const sections: Array<{ id: string; lengthM: number }> = watch('sections') ?? [];
  const atMiddle: boolean = !!watch(`eccs.${i}.transposedAtMidpoint`);
  const joints: number[] | undefined = watch(`eccs.${i}.transposedAtJoints`);
  const how: Crossing = atMiddle ? 'middle' : joints ? 'joints' : 'none';
  const from = sections.findIndex((s) => s.id === watch(`eccs.${i}.fromSectionId`));
  const to = sections.findIndex((s) => s.id === watch(`eccs.${i}.toSectionId`));
  // Joints strictly inside the run: after the first section and before the last one's end.
  const inner = jointOptions(sections, watch('jointNames')).filter(([j]) => from >= 0 && to >= 0 && j > from && j <= to);
  const outside = (joints ?? []).filter((j) => !inner.some(([k]) => k === j));

  function choose(next: Crossing) {
    setValue(`eccs.${i}.transposedAtMidpoint`, next === 'middle', { shouldDirty: true });
    setValue(`eccs.${i}.transposedAtJoints`, next === 'joints' ? (joints ?? []) : undefined, { shouldDirty: true, shouldValidate: true });
  }
  function toggle(j: number, on: boolean) {
    const list = (joints ?? []).filter((x) => x !== j);
    setValue(`eccs.${i}.transposedAtJoints`, (on ? [...list, j] : list).sort((a, b) => a - b), { shouldDirty: true, shouldValidate: true });
  }

  return (
    <fieldset className="text-xs" data-field={`eccs.${i}.transposedAtJoints`}>
      <label className="block">
        <span className="text-ink-soft">Transposition of ECC {id}</span>
        <select aria-label={`Transposition of ECC ${id}`} value={how} onChange={(e) => choose(e.target.value as Crossing)} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
          <option value="none">not transposed</option>
          <option value="middle">at the middle of its run</option>
          {/* A run of one section has no joint inside it to cross at; its choices are the middle or none. */}
          <option value="joints" disabled={inner.length === 0 && how !== 'joints'}>{inner.length === 0 ? 'at joints I choose (no joint inside its run)' : 'at joints I choose'}</option>
        </select>
      </label>
      {how === 'joints' && (
        <div className="mt-1 flex flex-wrap gap-2" role="group" aria-label={`Transposition joints of ECC ${id}`}>
          {inner.length === 0 && <span className="text-ink-soft">The run has no joint inside it: choose &quot;at the middle of its run&quot;, or run the ECC along more than one section.</span>}
          {!joints?.length && (
            <span className="text-ink-soft" data-testid={`ecc-${i}-no-crossing`}>
              No joint ticked: the ECC is saved and calculated as not transposed.
            </span>
          )}
          {inner.map(([j, label]) => (
            <label key={j} className="flex items-center gap-1">
              <input type="checkbox" aria-label={`ECC ${id} transposed at J${j}`} checked={(joints ?? []).includes(j)} onChange={(e) => toggle(j, e.target.checked)} /> {label}
            </label>
          ))}
          {outside.map((j) => (
            <label key={j} className="flex items-center gap-1 text-fail">
              <input type="checkbox" aria-label={`ECC ${id} transposed at J${j}`} checked onChange={() => toggle(j, false)} /> J{j} (outside the run)
            </label>
          ))}
        </div>
      )}
      <ErrorBeside name={`eccs.${i}.transposedAtJoints`} />
      {(joints ?? []).map((_, k) => <ErrorBeside key={k} name={`eccs.${i}.transposedAtJoints.${k}`} />)}
    </fieldset>
  );
}

