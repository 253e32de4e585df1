import { useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { studySchema, describeIssues } from '../../lib/schemas/study.schema';
import { api } from '../../lib/queries/api-client';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { Busy, Button, ErrorNote } from '../ui/parts';
import { useLeaveGuard } from './leave-guard';

/** The inputs as JSON, checked against the same schema as the forms before saving. */
export default function JsonInputsEditor({ detail, readOnly }: { detail: RevisionDetail; readOnly: boolean }) {
  const queryClient = useQueryClient();
  const r = detail.revision;
  const [text, setText] = useState(() => JSON.stringify(r.inputs, null, 2));
  const [problems, setProblems] = useState<Array<{ field: string; message: string }>>([]);
  useLeaveGuard(!readOnly && text !== JSON.stringify(r.inputs, null, 2));
  const save = useMutation({
    mutationFn: (inputs: unknown) => api(`/api/revisions/${r.id}/inputs`, { method: 'PUT', body: { version: r.version, inputs } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['revision', r.id] }),
  });
  const calculate = useMutation({ mutationFn: () => api<{ unchanged: boolean; inputsHash: string }>(`/api/revisions/${r.id}/calculate`, { method: 'POST' }), onSuccess: () => queryClient.invalidateQueries({ queryKey: ['revision', r.id] }) });

  function submit() {
    let raw: unknown;
    try {
      raw = JSON.parse(text);
    } catch (e) {
      return setProblems([{ field: '(text)', message: `Not valid JSON: ${(e as Error).message}` }]);
    }
    const parsed = studySchema.safeParse(raw);
    if (!parsed.success) return setProblems(describeIssues(parsed.error));
    setProblems([]);
    save.mutate(parsed.data);
  }

  return (
    <div className="space-y-2">
      <textarea aria-label="Inputs as JSON" readOnly={readOnly} spellCheck={false} className="h-96 w-full rounded border border-rule bg-panel p-2 font-mono text-xs" value={text} onChange={(e) => setText(e.target.value)} />
      {problems.length > 0 && (
        <ul role="alert" className="rounded border border-fail bg-fail/10 px-3 py-2 text-sm text-fail" data-testid="json-problems">
          {problems.map((p) => <li key={p.field + p.message}><code>{p.field}</code>: {p.message}</li>)}
        </ul>
      )}
      {!readOnly && (
        <div className="flex items-center gap-2">
          <Button onClick={submit} disabled={save.isPending}>Save inputs</Button>
          <Button tone="plain" onClick={() => calculate.mutate()} disabled={calculate.isPending}>Calculate</Button>
          {calculate.isPending && <Busy label="Solving every case…" />}
          {calculate.data?.unchanged && calculate.data.inputsHash === r.inputsHash && <span className="text-sm text-ink-soft" role="status">Nothing had changed since the last calculation: the results stand as they were.</span>}
          <ErrorNote error={save.error ?? calculate.error} />
        </div>
      )}
    </div>
  );
}
