import { useRef, useState } from 'react';
import { useFormContext } from 'react-hook-form';
import { previewSections, type SectionsPreview } from '../../lib/paste/sections-paste';
import { moveSectionDown, removeSection, splitSection, type SectionEdit } from '../../lib/route-edits/section-edits';
import { readNumber } from '../../lib/paste/read-number';
import { Button } from '../ui/parts';
import { ErrorBeside, Num, Text, box } from './fields';
import PastePreview from './PastePreview';
import { sectionsToCsv } from './sections-csv';
import { jointName } from '../../lib/calc/bonding/joint-names';

type Section = { id: string; lengthM: number; layoutId: string; phaseRotation?: 0 | 1 | 2 };

/**
 * Route sections in order, with the chainage at each joint: type a length, or type the chainage
 * at a section's end and its length follows (the sections after it keep their lengths).
 */
export default function SectionsSection({ studyCode, onNotes }: { studyCode: string; onNotes: (notes: string[]) => void }) {
  const { watch, getValues, setValue, reset, register } = useFormContext();
  const sections: Section[] = watch('sections') ?? [];
  const layoutIds: string[] = (watch('layouts') ?? []).map((l: { id: string }) => l.id);
  const jointNames: Array<{ jointIndex: number; name: string }> | undefined = watch('jointNames');
  const [pasteText, setPasteText] = useState('');
  const [preview, setPreview] = useState<SectionsPreview | null>(null);
  const fileInput = useRef<HTMLInputElement>(null);
  const chainages = sections.reduce<number[]>((acc, s) => [...acc, acc[acc.length - 1] + (Number(s.lengthM) || 0)], [0]);

  function apply(edit: SectionEdit) {
    reset(edit.study, { keepDefaultValues: true });
    onNotes(edit.notes.length ? edit.notes : ['Every SVL, earthing override, internal fault, joint bay name and ECC still points at the same joint or section.']);
  }
  function setEndChainage(i: number, text: string) {
    const r = readNumber(text);
    if (!('value' in r)) return;
    setValue(`sections.${i}.lengthM`, Math.round((r.value - chainages[i]) * 1e6) / 1e6, { shouldDirty: true, shouldValidate: true });
  }
  function showPreview(text: string) {
    setPreview(previewSections(text, { defaultLayoutId: layoutIds[0] ?? 'L1', layoutIds }));
  }
  function applyPaste() {
    if (!preview?.ok) return;
    const rows = preview.rows.map((r) => r.section!);
    const ids = new Set(rows.map((r) => r.id));
    const notes: string[] = [`${rows.length} sections replace the ${sections.length} there were.`];
    const study = getValues();
    for (const [gi, g] of study.bonding.entries()) {
      const gone = g.sectionIds.filter((id: string) => !ids.has(id));
      if (gone.length) notes.push(`Bonding group ${gi + 1} names ${gone.join(', ')}, which are no longer sections: give its sections again.`);
    }
    for (const e of study.eccs ?? []) if (!ids.has(e.fromSectionId) || !ids.has(e.toSectionId)) notes.push(`ECC ${e.id} runs from ${e.fromSectionId} to ${e.toSectionId}; one of them is no longer a section.`);
    if ((study.svls ?? []).length || (study.earthing.overrides ?? []).length) notes.push('SVLs and earthing overrides keep their joint numbers: check them against the new sections.');
    setValue('sections', rows, { shouldDirty: true, shouldValidate: true });
    setPreview(null);
    setPasteText('');
    onNotes(notes);
  }
  function exportCsv() {
    const url = URL.createObjectURL(new Blob([sectionsToCsv(getValues('sections'))], { type: 'text/csv' }));
    Object.assign(document.createElement('a'), { href: url, download: `${studyCode}-sections.csv` }).click();
    URL.revokeObjectURL(url);
  }

  return (
    <section className={box} aria-label="Route sections">
      <h3 className="mb-2 font-semibold">Route sections and joint bays</h3>
      <table className="text-sm" data-testid="sections-table">
        <thead><tr className="text-left text-xs text-ink-soft"><th className="pr-2">Joint at start (chainage)</th><th>Id</th><th>Length (m)</th><th>Chainage at end (m)</th><th>Layout</th><th>Cables shifted at start</th><th /></tr></thead>
        <tbody>
          {sections.map((s, i) => (
            <tr key={`${i}-${s.id}`} className="align-top">
              <td className="pr-2 text-xs text-ink-soft">{jointName({ jointNames }, i) === undefined ? `J${i}` : `${jointName({ jointNames }, i)} (J${i})`} ({format(chainages[i])} m)</td>
              <td><Text name={`sections.${i}.id`} label={`Id of section ${i + 1}`} hideLabel width="w-16" /></td>
              <td><Num name={`sections.${i}.lengthM`} label={`Length of section ${s.id}`} hideLabel /></td>
              <td>
                <input key={chainages[i + 1]} aria-label={`Chainage at the end of section ${s.id}`} inputMode="decimal" defaultValue={format(chainages[i + 1])} onBlur={(e) => setEndChainage(i, e.target.value)} className="mt-0.5 block w-24 rounded border border-rule px-1 py-0.5" />
              </td>
              <td>
                <select aria-label={`Layout of section ${s.id}`} {...register(`sections.${i}.layoutId`)} className="mt-0.5 rounded border border-rule px-1">
                  {layoutIds.map((l) => <option key={l} value={l}>{l}</option>)}
                </select>
                <ErrorBeside name={`sections.${i}.layoutId`} />
              </td>
              <td>
                <select aria-label={`Cables shifted at the start of ${s.id}`} {...register(`sections.${i}.phaseRotation`, { setValueAs: (v) => Number(v) })} className="mt-0.5 rounded border border-rule px-1">
                  <option value={0}>none</option><option value={1}>by 1</option><option value={2}>by 2</option>
                </select>
              </td>
              <td className="space-x-1 whitespace-nowrap">
                <Button tone="plain" aria-label={`Split ${s.id}`} onClick={() => apply(splitSection(getValues() as never, i))}>Split</Button>
                <Button tone="plain" aria-label={`Move ${s.id} up`} disabled={i === 0} onClick={() => apply(moveSectionDown(getValues() as never, i - 1))}>↑</Button>
                <Button tone="plain" aria-label={`Move ${s.id} down`} disabled={i === sections.length - 1} onClick={() => apply(moveSectionDown(getValues() as never, i))}>↓</Button>
                <Button tone="danger" aria-label={`Remove ${s.id}`} disabled={sections.length === 1} onClick={() => apply(removeSection(getValues() as never, i))}>Remove</Button>
              </td>
            </tr>
          ))}
          <tr><td className="text-xs text-ink-soft">J{sections.length} ({format(chainages[sections.length])} m): route end</td></tr>
        </tbody>
      </table>
      <ErrorBeside name="sections" />
      <div className="mt-2 flex flex-wrap items-start gap-2">
        <Button tone="plain" onClick={() => setValue('sections', [...sections, { id: freeId(sections), lengthM: 500, layoutId: layoutIds[0] ?? 'L1', phaseRotation: 0 }], { shouldDirty: true })}>Add section</Button>
        <Button tone="plain" onClick={exportCsv}>Export CSV</Button>
        <Button tone="plain" onClick={() => fileInput.current?.click()}>Import CSV</Button>
        <input ref={fileInput} type="file" accept=".csv,text/csv,text/plain" className="hidden" aria-label="CSV file of sections" onChange={async (e) => { const file = e.target.files?.[0]; if (file) showPreview(await file.text()); e.target.value = ''; }} />
        <label className="text-xs">Paste from a spreadsheet (id, length, layout, shift; or lengths only)
          <textarea aria-label="Pasted sections" className="block w-80 rounded border border-rule px-1 font-mono" rows={3} value={pasteText} onChange={(e) => setPasteText(e.target.value)} />
        </label>
        <Button tone="plain" disabled={!pasteText.trim()} onClick={() => showPreview(pasteText)}>Preview pasted rows</Button>
      </div>
      {preview && <PastePreview preview={preview} onApply={applyPaste} onDiscard={() => setPreview(null)} />}
    </section>
  );
}

const format = (m: number) => (Number.isFinite(m) ? String(Math.round(m * 1000) / 1000) : '?');
function freeId(sections: Section[]) {
  const taken = new Set(sections.map((s) => s.id));
  let n = sections.length + 1;
  while (taken.has(`S${n}`)) n++;
  return `S${n}`;
}
