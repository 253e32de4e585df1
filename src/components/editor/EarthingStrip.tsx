import { useFormContext } from 'react-hook-form';
import { ErrorBeside, Num, box } from './fields';
import { jointOptions } from './joints';

type Override = { jointIndex: number; resistanceOhm?: number; noElectrode?: true };

/** The route as a strip of joints, each with the electrode it has: the study's value, its own, or none. */
export default function EarthingStrip() {
  const { watch, getValues, setValue } = useFormContext();
  const sections = watch('sections') ?? [];
  const overrides: Override[] = watch('earthing.overrides') ?? [];
  const earthing = watch('earthing') ?? {};
  const joints = jointOptions(sections);
  const last = sections.length;
  const studyValue = (j: number) => (j === 0 ? earthing.routeStartOhm : j === last ? earthing.routeEndOhm : earthing.linkBoxOhm);

  function choose(j: number, how: string) {
    const rest = (getValues('earthing.overrides') ?? []).filter((o: Override) => o.jointIndex !== j);
    const next = how === 'study' ? rest : [...rest, how === 'none' ? { jointIndex: j, noElectrode: true } : { jointIndex: j, resistanceOhm: Number(studyValue(j)) || 1 }];
    setValue('earthing.overrides', next.sort((a: Override, b: Override) => a.jointIndex - b.jointIndex), { shouldDirty: true });
  }

  return (
    <section className={box} aria-label="Earthing along the route">
      <h3 className="mb-2 font-semibold">Earthing along the route</h3>
      <ol className="flex gap-1 overflow-x-auto pb-2" data-testid="route-strip">
        {joints.map(([j, label]) => {
          const k = overrides.findIndex((o) => o.jointIndex === j);
          const o = overrides[k];
          const how = !o ? 'study' : o.noElectrode ? 'none' : 'own';
          return (
            <li key={j} className={`min-w-40 rounded border p-1 text-xs ${o ? 'border-copper' : 'border-rule'}`}>
              <p className="font-semibold">{label}</p>
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
      {overrides.filter((o) => o.jointIndex > last).map((o) => <p key={o.jointIndex} role="alert" className="text-sm text-fail">An override names joint {o.jointIndex}, beyond the route end (J{last}).</p>)}
    </section>
  );
}
