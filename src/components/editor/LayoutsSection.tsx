import { useFieldArray, useFormContext } from 'react-hook-form';
import { cablePositions } from '../../lib/calc/bonding/cross-section';
import { Button } from '../ui/parts';
import { ErrorBeside, Num, Text, box } from './fields';
import CrossSectionSketch from './CrossSectionSketch';

type Placement = { circuitId: string; formation: 'trefoil' | 'flat' | 'coordinates'; spacingM?: number; depthM?: number; centreXM?: number; positions?: Array<{ xM: number; depthM: number }> };

/** Layouts: where each circuit's cables and each ECC lie in the cross-section, with the sketch beside. */
export default function LayoutsSection() {
  const { control, watch, getValues, setValue } = useFormContext();
  const layouts = useFieldArray({ control, name: 'layouts' });
  const values = watch('layouts') ?? [];
  const circuitIds: string[] = (watch('circuits') ?? []).map((c: { id: string }) => c.id);
  const eccIds: string[] = (watch('eccs') ?? []).map((e: { id: string }) => e.id);

  function changeFormation(li: number, ci: number, formation: Placement['formation']) {
    const p: Placement = getValues(`layouts.${li}.circuits.${ci}`);
    let next: Placement;
    if (formation === 'coordinates') {
      // Start the table from where the cables are now, so nothing moves by choosing it.
      const positions = p.formation === 'coordinates' ? p.positions! : cablePositions({ centreXM: 0, ...p } as never).map((q) => ({ xM: round(q.xM), depthM: round(q.depthM) }));
      next = { circuitId: p.circuitId, formation, positions };
    } else {
      const pos = p.positions ?? [];
      const spacing = p.spacingM ?? (pos.length === 3 ? round(Math.abs(pos[2].xM - pos[0].xM) / (formation === 'flat' ? 2 : 1)) : 0.11);
      next = { circuitId: p.circuitId, formation, spacingM: spacing, depthM: p.depthM ?? pos[0]?.depthM ?? 1.2, centreXM: p.centreXM ?? (pos.length ? round((pos[0].xM + pos[2].xM) / 2) : 0) };
    }
    setValue(`layouts.${li}.circuits.${ci}`, next, { shouldDirty: true });
  }

  return (
    <section className={box} aria-label="Formation">
      <h3 className="mb-2 font-semibold">Formation (layouts)</h3>
      {layouts.fields.map((f, li) => {
        const layout = values[li];
        if (!layout) return null;
        const placed: string[] = layout.circuits.map((c: Placement) => c.circuitId);
        const eccsPlaced: string[] = (layout.eccs ?? []).map((e: { eccId: string }) => e.eccId);
        return (
          <div key={f.id} className="mb-3 flex flex-wrap gap-6 border-b border-rule pb-3" data-testid={`layout-${layout.id}`}>
            <div className="space-y-2">
              <div className="flex items-end gap-2">
                <Text name={`layouts.${li}.id`} label={`Id of layout ${li + 1}`} width="w-16" />
                <Text name={`layouts.${li}.name`} label={`Name of layout ${layout.id}`} width="w-48" />
                <Button tone="danger" disabled={layouts.fields.length === 1} onClick={() => layouts.remove(li)}>Remove layout {layout.id}</Button>
              </div>
              {layout.circuits.map((c: Placement, ci: number) => (
                <div key={`${c.circuitId}-${ci}`} className="rounded border border-rule p-2">
                  <div className="flex flex-wrap items-end gap-2">
                    <span className="text-sm font-semibold">{c.circuitId}</span>
                    <label className="block text-xs"><span className="text-ink-soft">Formation</span>
                      <select aria-label={`Formation of ${c.circuitId} in ${layout.id}`} value={c.formation} onChange={(e) => changeFormation(li, ci, e.target.value as Placement['formation'])} className="mt-0.5 block rounded border border-rule px-1 py-0.5">
                        <option value="trefoil">trefoil</option><option value="flat">flat</option><option value="coordinates">by coordinates</option>
                      </select>
                    </label>
                    {c.formation !== 'coordinates' && <>
                      <Num name={`layouts.${li}.circuits.${ci}.spacingM`} label={`Spacing of ${c.circuitId} in ${layout.id} (m)`} />
                      <Num name={`layouts.${li}.circuits.${ci}.depthM`} label={`Depth of ${c.circuitId} in ${layout.id} (m)`} />
                      <Num name={`layouts.${li}.circuits.${ci}.centreXM`} label={`Offset of ${c.circuitId} in ${layout.id} (m)`} />
                    </>}
                    <Button tone="danger" disabled={layout.circuits.length === 1} onClick={() => setValue(`layouts.${li}.circuits`, layout.circuits.filter((_: unknown, k: number) => k !== ci), { shouldDirty: true })}>Take {c.circuitId} out</Button>
                  </div>
                  {c.formation === 'coordinates' && (
                    <table className="mt-1 text-xs" aria-label={`Coordinates of ${c.circuitId} in ${layout.id}`}>
                      <thead><tr className="text-left text-ink-soft"><th className="pr-2">Phase</th><th className="pr-2">x (m)</th><th>Depth (m)</th></tr></thead>
                      <tbody>
                        {['a', 'b', 'c'].map((ph, k) => (
                          <tr key={ph}>
                            <td className="pr-2">{ph}</td>
                            <td className="pr-2"><Num name={`layouts.${li}.circuits.${ci}.positions.${k}.xM`} label={`x of ${c.circuitId}-${ph} in ${layout.id}`} hideLabel width="w-20" /></td>
                            <td><Num name={`layouts.${li}.circuits.${ci}.positions.${k}.depthM`} label={`Depth of ${c.circuitId}-${ph} in ${layout.id}`} hideLabel width="w-20" /></td>
                          </tr>
                        ))}
                      </tbody>
                    </table>
                  )}
                </div>
              ))}
              <ErrorBeside name={`layouts.${li}.circuits`} />
              {circuitIds.filter((id) => !placed.includes(id)).map((id) => (
                <Button key={id} tone="plain" onClick={() => setValue(`layouts.${li}.circuits`, [...layout.circuits, { circuitId: id, formation: 'trefoil', spacingM: 0.11, depthM: 1.2, centreXM: layout.circuits.length }], { shouldDirty: true })}>Place {id} in {layout.id}</Button>
              ))}
              {(layout.eccs ?? []).map((e: { eccId: string }, ei: number) => (
                <div key={`${e.eccId}-${ei}`} className="flex flex-wrap items-end gap-2">
                  <span className="text-sm">ECC {e.eccId}</span>
                  <Num name={`layouts.${li}.eccs.${ei}.xM`} label={`x of ECC ${e.eccId} in ${layout.id} (m)`} />
                  <Num name={`layouts.${li}.eccs.${ei}.depthM`} label={`Depth of ECC ${e.eccId} in ${layout.id} (m)`} />
                  <Button tone="danger" onClick={() => setValue(`layouts.${li}.eccs`, layout.eccs.filter((_: unknown, k: number) => k !== ei), { shouldDirty: true })}>Take ECC {e.eccId} out</Button>
                </div>
              ))}
              {eccIds.filter((id) => !eccsPlaced.includes(id)).map((id) => (
                <Button key={id} tone="plain" onClick={() => setValue(`layouts.${li}.eccs`, [...(layout.eccs ?? []), { eccId: id, xM: 0.5, depthM: 1.0 }], { shouldDirty: true })}>Place ECC {id} in {layout.id}</Button>
              ))}
              <ErrorBeside name={`layouts.${li}.eccs`} />
            </div>
            <CrossSectionSketch layout={layout} cableTypes={watch('cableTypes')} circuits={watch('circuits')} />
          </div>
        );
      })}
      <Button tone="plain" onClick={() => { const last = getValues('layouts').at(-1); layouts.append({ ...structuredClone(last), id: nextId(getValues('layouts'), 'L'), name: `copy of ${last.id}` }); }}>Add layout (a copy of the last)</Button>
    </section>
  );
}

const round = (x: number) => Math.round(x * 1e4) / 1e4;
export function nextId(items: Array<{ id: string }>, prefix: string) {
  const taken = new Set(items.map((x) => x.id));
  let n = items.length + 1;
  while (taken.has(`${prefix}${n}`)) n++;
  return `${prefix}${n}`;
}
