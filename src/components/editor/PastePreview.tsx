import { describeDelimiter, type SectionsPreview } from '../../lib/paste/sections-paste';
import { Button } from '../ui/parts';

/** Every parsed row and every error of a paste or import, shown before anything is applied. */
export default function PastePreview({ preview, onApply, onDiscard }: { preview: SectionsPreview; onApply: () => void; onDiscard: () => void }) {
  const bad = preview.rows.filter((r) => !r.section).length;
  return (
    <div className="mt-2 rounded border border-rule bg-paper p-2" data-testid="paste-preview" aria-label="Rows read from the paste, before applying">
      <p className="text-sm">{describeDelimiter(preview)} {preview.rows.length} row(s) read{bad ? `, ${bad} refused` : ''}.</p>
      {preview.problems.map((p) => <p key={p} role="alert" className="text-sm text-fail">{p}</p>)}
      <table className="mt-1 text-sm">
        <thead><tr className="text-left text-xs text-ink-soft"><th className="pr-2">Line</th><th className="pr-2">As pasted</th><th className="pr-2">Id</th><th className="pr-2">Length (m)</th><th className="pr-2">Layout</th><th className="pr-2">Shift</th><th>Problem</th></tr></thead>
        <tbody>
          {preview.rows.map((r) => (
            <tr key={r.line} data-testid="paste-row" className={r.section ? '' : 'text-fail'}>
              <td className="pr-2">{r.line}</td>
              <td className="pr-2 font-mono text-xs">{r.cells.map((c) => `[${c}]`).join(' ')}</td>
              <td className="pr-2">{r.section?.id}</td>
              <td className="pr-2" data-testid="paste-length">{r.section?.lengthM}</td>
              <td className="pr-2">{r.section?.layoutId}</td>
              <td className="pr-2">{r.section?.phaseRotation}</td>
              <td role={r.errors.length ? 'alert' : undefined}>{r.errors.join(' ')}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="mt-2 flex gap-2">
        <Button onClick={onApply} disabled={!preview.ok}>Replace the sections with these {preview.rows.length}</Button>
        <Button tone="plain" onClick={onDiscard}>Discard</Button>
        {!preview.ok && <span className="text-sm text-fail">Correct the rows marked, then paste again: nothing has been changed.</span>}
      </div>
    </div>
  );
}
