import { useMemo, useState } from 'react';
import { applyMerge, defaultChoice, mergeFields, type Choice } from '../../lib/merge/three-way';
import { Button } from '../ui/parts';
import { fieldInWords } from './field-words';

const show = (v: unknown) => (v === undefined ? '(none)' : typeof v === 'object' ? JSON.stringify(v) : String(v));

/**
 * Someone saved the inputs after these edits began. Each field either side changed is shown with
 * the stored value (theirs) beside the person's own (mine); fields changed on one side default
 * to that side, fields both changed default to mine, and each can be switched.
 */
export default function ConflictView({ base, mine, theirs, onResolve, onDiscardMine }: { base: unknown; mine: unknown; theirs: unknown; onResolve: (merged: unknown) => void; onDiscardMine: () => void }) {
  const fields = useMemo(() => mergeFields(base, mine, theirs), [base, mine, theirs]);
  const [choices, setChoices] = useState<Record<string, Choice>>({});
  const pick = (path: string, c: Choice) => setChoices((x) => ({ ...x, [path]: c }));
  const conflicts = fields.filter((f) => f.conflict).length;
  return (
    <section className="rounded-lg border-2 border-caution bg-caution/10 p-3" data-testid="conflict-view" aria-label="Edit conflict">
      <h3 className="font-semibold">Someone else saved these inputs while you were editing</h3>
      <p className="text-sm">Your edits are kept. {fields.length} field(s) differ{conflicts ? `, ${conflicts} changed by both` : ''}: choose, field by field, which value to keep, then save.</p>
      <table className="mt-2 text-sm">
        <thead><tr className="text-left text-xs text-ink-soft"><th className="pr-3">Field</th><th className="pr-3">Before</th><th className="pr-3">Theirs (saved)</th><th className="pr-3">Mine</th><th>Keep</th></tr></thead>
        <tbody>
          {fields.map((f) => {
            const chosen = choices[f.path] ?? defaultChoice(f);
            const words = fieldInWords(f.path, theirs) || 'The whole study';
            return (
              <tr key={f.path} data-testid="conflict-field" data-path={f.path} className={f.conflict ? 'font-semibold' : ''}>
                <td className="pr-3">{words}{f.conflict ? ' (changed by both)' : ''}</td>
                <td className="max-w-48 truncate pr-3 font-mono text-xs">{show(f.base)}</td>
                <td className="max-w-48 truncate pr-3 font-mono text-xs">{show(f.theirs)}</td>
                <td className="max-w-48 truncate pr-3 font-mono text-xs">{show(f.mine)}</td>
                <td className="whitespace-nowrap text-xs">
                  <label className="mr-2"><input type="radio" name={`keep-${f.path}`} aria-label={`${words}: keep mine`} checked={chosen === 'mine'} onChange={() => pick(f.path, 'mine')} /> mine</label>
                  <label><input type="radio" name={`keep-${f.path}`} aria-label={`${words}: take theirs`} checked={chosen === 'theirs'} onChange={() => pick(f.path, 'theirs')} /> theirs</label>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <div className="mt-2 flex flex-wrap gap-2">
        <Button onClick={() => onResolve(applyMerge(theirs, fields, choices))}>Use the merged values</Button>
        <Button tone="plain" onClick={() => onResolve(applyMerge(theirs, fields, Object.fromEntries(fields.map((f) => [f.path, 'mine' as const]))))}>Keep all of mine</Button>
        <Button tone="danger" onClick={onDiscardMine}>Take theirs, drop my edits</Button>
      </div>
    </section>
  );
}
