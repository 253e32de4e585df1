import { useFieldArray, useFormContext } from 'react-hook-form';
import { Button } from '../ui/parts';
import { Check, Choice, ErrorBeside, Num, Text, box } from './fields';
import { CASE_KINDS, caseOfKind } from './case-shapes';
import { jointOptions } from './joints';

const PHASES: Array<[string, string]> = [['a', 'a'], ['b', 'b'], ['c', 'c']];
const ENDS: Array<[string, string]> = [['end', 'beyond the route end'], ['start', 'beyond the route start']];

/** Cases: each kind with its own fields. */
export default function CasesSection() {
  const { control, watch, getValues, setValue } = useFormContext();
  const cases = useFieldArray({ control, name: 'cases' });
  const circuitIds: string[] = (watch('circuits') ?? []).map((c: { id: string }) => c.id);
  const circuitOptions = circuitIds.map((id): [string, string] => [id, id]);
  const joints = jointOptions(watch('sections') ?? [], watch('jointNames'));

  function changeKind(i: number, kind: string) {
    setValue(`cases.${i}`, caseOfKind(getValues(`cases.${i}`), kind, circuitIds), { shouldDirty: true });
  }

  return (
    <section className={box} aria-label="Cases">
      <h3 className="mb-2 font-semibold">Cases</h3>
      {cases.fields.map((f, i) => {
        const c = watch(`cases.${i}`) ?? {};
        const at = (k: string) => `cases.${i}.${k}`;
        const who = c.id || String(i + 1);
        return (
          <div key={f.id} className="mb-2 space-y-1 border-b border-rule pb-2" data-testid="case-row">
            <div className="flex flex-wrap items-end gap-2">
              <Text name={at('id')} label={`Id of case ${i + 1}`} width="w-16" />
              <Text name={at('name')} label={`Name of case ${who}`} width="w-48" />
              <label className="block text-xs"><span className="text-ink-soft">Kind</span>
                <select aria-label={`Kind of case ${who}`} value={c.kind} onChange={(e) => changeKind(i, e.target.value)} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
                  {CASE_KINDS.map(([v, t]) => <option key={v} value={v}>{t}</option>)}
                </select>
              </label>
              {c.kind !== 'normal' && c.kind !== 'emergency' && <Num name={at('durationS')} label={`Duration of case ${who} (s)`} />}
              <Check name={at('svlsConducting')} label={`SVLs conduct in case ${who}`} />
              <Button tone="danger" disabled={cases.fields.length === 1} onClick={() => cases.remove(i)}>Remove case {who}</Button>
            </div>
            <div className="flex flex-wrap items-end gap-2 pl-4">
              {['normal', 'emergency', 'three-phase-fault'].includes(c.kind) && (c.currents ?? []).map((cur: { circuitId: string }, k: number) => (
                <span key={k} className="flex items-end gap-1">
                  <Num name={at(`currents.${k}.currentA`)} label={`Current in ${cur.circuitId}, case ${who} (A)`} />
                  <Num name={at(`currents.${k}.angleDeg`)} label={`Angle in ${cur.circuitId}, case ${who} (°)`} width="w-16" />
                </span>
              ))}
              {['normal', 'emergency', 'three-phase-fault'].includes(c.kind) && circuitIds.filter((id) => !(c.currents ?? []).some((x: { circuitId: string }) => x.circuitId === id)).map((id) => (
                <Button key={id} tone="plain" onClick={() => setValue(at('currents'), [...(c.currents ?? []), { circuitId: id, currentA: 0, angleDeg: 0 }], { shouldDirty: true })}>Give {id} a current</Button>
              ))}
              {c.kind === 'earth-fault' && <>
                <Choice name={at('earthFault.circuitId')} label={`Faulted circuit, case ${who}`} options={circuitOptions} />
                <Choice name={at('earthFault.phase')} label={`Faulted phase, case ${who}`} options={PHASES} />
                <Num name={at('earthFault.currentA')} label={`Earth-fault current, case ${who} (A)`} />
                <Choice name={at('earthFault.beyond')} label={`Fault lies, case ${who}`} options={ENDS} />
                <Num name={at('earthFault.sourceStationShare')} label={`Share returning through the source station, case ${who}`} />
              </>}
              {c.kind === 'phase-phase-earth-fault' && <>
                <Choice name={at('phasePhaseEarthFault.circuitId')} label={`Faulted circuit, case ${who}`} options={circuitOptions} />
                {[0, 1].map((k) => (
                  <span key={k} className="flex items-end gap-1">
                    <Choice name={at(`phasePhaseEarthFault.phases.${k}`)} label={`Phase ${k + 1}, case ${who}`} options={PHASES} />
                    <Num name={at(`phasePhaseEarthFault.currents.${k}.currentA`)} label={`Current of phase ${k + 1}, case ${who} (A)`} />
                    <Num name={at(`phasePhaseEarthFault.currents.${k}.angleDeg`)} label={`Angle of phase ${k + 1}, case ${who} (°)`} width="w-16" />
                  </span>
                ))}
                <Choice name={at('phasePhaseEarthFault.beyond')} label={`Fault lies, case ${who}`} options={ENDS} />
                <Num name={at('phasePhaseEarthFault.sourceStationShare')} label={`Share returning through the source station, case ${who}`} />
              </>}
              {c.kind === 'internal-fault' && c.internalFault && <InternalFault i={i} who={who} circuitOptions={circuitOptions} joints={joints} />}
              {c.kind === 'station-gpr' && <>
                {(c.stationGpr ?? []).map((_g: unknown, k: number) => (
                  <span key={k} className="flex items-end gap-1">
                    <Choice name={at(`stationGpr.${k}.station`)} label={`Station ${k + 1}, case ${who}`} options={[['start', 'at the route start'], ['end', 'at the route end']]} />
                    <Num name={at(`stationGpr.${k}.voltageV`)} label={`Earth potential rise ${k + 1}, case ${who} (V)`} />
                    <Num name={at(`stationGpr.${k}.angleDeg`)} label={`Angle of rise ${k + 1}, case ${who} (°)`} width="w-16" />
                  </span>
                ))}
                {(c.stationGpr ?? []).length < 2 && <Button tone="plain" onClick={() => setValue(at('stationGpr'), [...(c.stationGpr ?? []), { station: 'end', voltageV: 1000, angleDeg: 0 }], { shouldDirty: true })}>Add the other station</Button>}
              </>}
              {['currents', 'earthFault', 'phasePhaseEarthFault', 'internalFault', 'stationGpr'].map((k) => <ErrorBeside key={k} name={at(k)} />)}
            </div>
          </div>
        );
      })}
      <Button tone="plain" onClick={() => cases.append(caseOfKind({ id: nextCaseId(getValues('cases')), name: 'New case', kind: 'normal' }, 'normal', circuitIds))}>Add case</Button>
      <ErrorBeside name="cases" />
    </section>
  );
}

function InternalFault({ i, who, circuitOptions, joints }: { i: number; who: string; circuitOptions: Array<[string, string]>; joints: Array<[number, string]> }) {
  const { watch, setValue, getValues } = useFormContext();
  const at = (k: string) => `cases.${i}.internalFault.${k}`;
  const f = watch(`cases.${i}.internalFault`);
  const where = f.chainageM !== undefined ? 'chainage' : 'joint';
  function place(how: string) {
    const { jointIndex: _j, chainageM: _c, ...rest } = getValues(`cases.${i}.internalFault`);
    setValue(`cases.${i}.internalFault`, how === 'joint' ? { ...rest, jointIndex: 1 } : { ...rest, chainageM: 1 }, { shouldDirty: true });
  }
  return <>
    <Choice name={at('circuitId')} label={`Faulted circuit, case ${who}`} options={circuitOptions} />
    <Choice name={at('phase')} label={`Faulted phase, case ${who}`} options={PHASES} />
    <label className="block text-xs"><span className="text-ink-soft">Fault placed</span>
      <select aria-label={`Fault placed, case ${who}`} value={where} onChange={(e) => place(e.target.value)} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
        <option value="joint">at a joint</option><option value="chainage">at a chainage</option>
      </select>
    </label>
    {where === 'joint' ? <>
      <Choice name={at('jointIndex')} label={`Fault joint, case ${who}`} numeric options={joints} />
      <Choice name={at('side')} label={`Side of the joint, case ${who}`} options={[['arriving', 'sheath arriving'], ['leaving', 'sheath leaving']]} />
    </> : <Num name={at('chainageM')} label={`Fault chainage, case ${who} (m)`} />}
    <Num name={at('fromStart.currentA')} label={`Infeed from the start, case ${who} (A)`} />
    <Num name={at('fromStart.angleDeg')} label={`Angle of the infeed from the start, case ${who} (°)`} width="w-16" />
    <Num name={at('fromEnd.currentA')} label={`Infeed from the end, case ${who} (A)`} />
    <Num name={at('fromEnd.angleDeg')} label={`Angle of the infeed from the end, case ${who} (°)`} width="w-16" />
    <ErrorBeside name={at('jointIndex')} />
    <ErrorBeside name={at('fromStart')} />
  </>;
}

function nextCaseId(cases: Array<{ id: string }>) {
  const taken = new Set(cases.map((c) => c.id));
  let n = cases.length + 1;
  while (taken.has(`K${n}`)) n++;
  return `K${n}`;
}
