import { useFormContext } from 'react-hook-form';
import { ErrorBeside, Num, box } from './fields';
import { jointOptions } from './joints';
import { atPath } from './form-fields';

type Override = { jointIndex: number; resistanceOhm?: number; noElectrode?: true };
type JointName = { jointIndex: number; name: string };

/** The route as a strip of joint bays, each with its name (optional) and the electrode it has: the study's value, its own, or none. */
export default function EarthingStrip() {
  const { watch, getValues, setValue, formState } = useFormContext();
  const sections = watch('sections') ?? [];
  const overrides: Override[] = watch('earthing.overrides') ?? [];
  const names: JointName[] = watch('jointNames') ?? [];
  const earthing = watch('earthing') ?? {};
  const joints = jointOptions(sections, names);
  const last = sections.length;
  const studyValue = (j: number) => (j === 0 ? earthing.routeStartOhm : j === last ? earthing.routeEndOhm : earthing.linkBoxOhm);

  function choose(j: number, how: string) {
    const rest = (getValues('earthing.overrides') ?? []).filter((o: Override) => o.jointIndex !== j);
    const next = how === 'study' ? rest : [...rest, how === 'none' ? { jointIndex: j, noElectrode: true } : { jointIndex: j, resistanceOhm: Number(studyValue(j)) || 1 }];
    setValue('earthing.overrides', next.sort((a: Override, b: Override) => a.jointIndex - b.jointIndex), { shouldDirty: true });
  }

  // Names live in a list by joint number; an emptied name leaves the list, and an empty list the study.
  function rename(j: number, text: string) {
    const list: JointName[] = getValues('jointNames') ?? [];
    const k = list.findIndex((n) => n.jointIndex === j);
    const next = k < 0 ? [...list, { jointIndex: j, name: text }] : list.map((n, i) => (i === k ? { ...n, name: text } : n));
    const kept = next.filter((n) => n.name !== '').sort((a, b) => a.jointIndex - b.jointIndex);
    setValue('jointNames', kept.length ? kept : undefined, { shouldDirty: true, shouldValidate: true });
  }

  return (
    <section className={box} aria-label="Earthing along the route">
      <h3 className="mb-2 font-semibold">Joint bays and earthing along the route</h3>
      <ol className="flex gap-1 overflow-x-auto pb-2" data-testid="route-strip">
        {joints.map(([j, label]) => {
          const k = overrides.findIndex((o) => o.jointIndex === j);
          const o = overrides[k];
          const how = !o ? 'study' : o.noElectrode ? 'none' : 'own';
          const nk = names.findIndex((n) => n.jointIndex === j);
          return (
            <li key={j} className={`min-w-40 rounded border p-1 text-xs ${o ? 'border-copper' : 'border-rule'}`}>
              <p className="font-semibold">{label}</p>
              <label className="block" data-field={`jointNames.${nk}.name`}>
                <span className="text-ink-soft">Joint bay name</span>
                <input aria-label={`Name of joint bay J${j}`} aria-invalid={nk >= 0 && !!atPath(formState.errors, `jointNames.${nk}`)} type="text" placeholder={`J${j}`} value={names[nk]?.name ?? ''} onChange={(e) => rename(j, e.target.value)} className="mt-0.5 block w-32 rounded border border-rule px-1" />
                {nk >= 0 && <ErrorBeside name={`jointNames.${nk}.name`} />}
                {nk >= 0 && <ErrorBeside name={`jointNames.${nk}.jointIndex`} />}
              </label>
              <select aria-label={`Electrode at J${j}`} value={how} onChange={(e) => choose(j, e.target.value)} className="mt-0.5 rounded border border-rule px-1">
                <option value="study">study value ({String(studyValue(j) ?? '?')} Ω)</option>
                <option value="own">its own</option>
                {j !== 0 && j !== last && <option value="none">no electrode</option>}
              </select>
              {how === 'own' && <Num name={`earthing.overrides.${k}.resistanceOhm`} label={`Earth resistance at J${j} (Ω)`} width="w-20" />}
              {k >= 0 && <ErrorBeside name={`earthing.overrides.${k}`} />}
            </li>
          );
        })}
      </ol>
      <ErrorBeside name="earthing.overrides" />
      <ErrorBeside name="jointNames" />
      {names.filter((n) => n.jointIndex > last).map((n) => <p key={`name-${n.jointIndex}`} role="alert" className="text-sm text-fail">Joint bay {n.name} names joint {n.jointIndex}, beyond the route end (J{last}).</p>)}
      {overrides.filter((o) => o.jointIndex > last).map((o) => <p key={o.jointIndex} role="alert" className="text-sm text-fail">An override names joint {o.jointIndex}, beyond the route end (J{last}).</p>)}
    </section>
  );
}
