import { useEffect, useRef, useState, type ReactNode } from 'react';
import { FormProvider, useForm, type FieldValues } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ZodType } from 'zod';
import { ApiError, api } from '../../lib/queries/api-client';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import { sameJson } from '../../lib/merge/three-way';
import { Busy, Button, ErrorNote } from '../ui/parts';
import ConflictView from './ConflictView';
import ErrorList, { flattenErrors, goToField } from './ErrorList';
import { clearDraft, readDraft, writeDraft, type Draft } from './draft-store';
import { useLeaveGuard } from './leave-guard';

type Pending = { kind: 'offer'; draft: Draft } | { kind: 'conflict'; draft: Draft } | null;

/**
 * The frame every study form shares: validation by the study's schema, save and calculate, the
 * unsaved-edits guard, the draft kept in this browser, the conflict view, and the error list.
 * `children` receives the notes callback for edits that change references.
 */
export default function StudyForm({ detail, readOnly, schema, children }: { detail: RevisionDetail; readOnly: boolean; schema: ZodType; children: (onNotes: (notes: string[]) => void) => ReactNode }) {
  const queryClient = useQueryClient();
  const r = detail.revision;
  const form = useForm<FieldValues>({ resolver: zodResolver(schema as never) as never, defaultValues: r.inputs as FieldValues, mode: 'onBlur', shouldFocusError: false });
  const { handleSubmit, formState, setError, reset, setValue, getValues, watch } = form;
  const [ready, setReady] = useState(false);
  const [pending, setPending] = useState<Pending>(null);
  const [notes, setNotes] = useState<string[]>([]);
  const [storageRefused, setStorageRefused] = useState(false);
  const pendingRef = useRef<Pending>(null);
  pendingRef.current = pending;
  const dirty = formState.isDirty && !readOnly;
  useLeaveGuard(dirty);

  // On arrival: a draft from an earlier visit is offered back, or merged when the stored inputs moved on.
  useEffect(() => {
    setReady(true);
    if (readOnly) return;
    const d = readDraft(r.id);
    if (!d) return;
    if (sameJson(d.inputs, r.inputs)) return clearDraft(r.id);
    setPending(d.version === r.version || sameJson(d.base, r.inputs) ? { kind: 'offer', draft: d } : { kind: 'conflict', draft: d });
  }, []); // eslint-disable-line react-hooks/exhaustive-deps

  // Every edit is kept locally (debounced), and flushed when the editor goes away.
  useEffect(() => {
    if (readOnly) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const keep = () => {
      if (pendingRef.current) return;
      const values = getValues();
      if (sameJson(values, r.inputs)) return clearDraft(r.id);
      setStorageRefused(!writeDraft(r.id, { version: r.version, savedAt: new Date().toISOString(), base: r.inputs, inputs: values }));
    };
    const sub = watch(() => {
      clearTimeout(timer);
      timer = setTimeout(() => { timer = undefined; keep(); }, 250);
    });
    // A reload or a closed tab within the debounce would otherwise lose the last edits: unmount
    // cleanups do not run on unload, so the pending write is flushed when the page goes.
    const flush = () => {
      if (!timer) return;
      clearTimeout(timer);
      timer = undefined;
      keep();
    };
    window.addEventListener('pagehide', flush);
    return () => {
      sub.unsubscribe();
      window.removeEventListener('pagehide', flush);
      flush();
    };
  }, [r.id, r.version]); // eslint-disable-line react-hooks/exhaustive-deps

  function adopt(values: unknown, note: string) {
    reset(r.inputs as FieldValues);
    for (const [k, v] of Object.entries(values as Record<string, unknown>)) setValue(k, v, { shouldDirty: true });
    setPending(null);
    setNotes([note]);
    writeDraft(r.id, { version: r.version, savedAt: new Date().toISOString(), base: r.inputs, inputs: getValues() });
  }

  const save = useMutation({
    mutationFn: (inputs: FieldValues) => api<{ version: number }>(`/api/revisions/${r.id}/inputs`, { method: 'PUT', body: { version: r.version, inputs } }),
    onSuccess: async (_d, inputs) => {
      clearDraft(r.id);
      reset(inputs);
      await queryClient.invalidateQueries({ queryKey: ['revision', r.id] });
    },
    onError: async (e) => {
      if (!(e instanceof ApiError)) return;
      if (e.status === 409) {
        // Keep the edits, then load what is stored: the editor comes back with both side by side.
        writeDraft(r.id, { version: r.version, savedAt: new Date().toISOString(), base: r.inputs, inputs: getValues() });
        await queryClient.invalidateQueries({ queryKey: ['revision', r.id] });
        return;
      }
      for (const f of e.fields) setError(f.field.replace(/^inputs\./, ''), { message: f.message });
      const first = e.fields[0]?.field.replace(/^inputs\./, '');
      if (first) requestAnimationFrame(() => goToField(first));
    },
  });
  const calculate = useMutation({
    mutationFn: () => api<{ unchanged: boolean; inputsHash: string }>(`/api/revisions/${r.id}/calculate`, { method: 'POST' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['revision', r.id] }),
  });
  const onInvalid = () => requestAnimationFrame(() => { const first = flattenErrors(form.formState.errors)[0]; if (first) goToField(first.path); });
  const lock = readOnly || !ready || !!pending;

  return (
    <FormProvider {...form}>
      {pending?.kind === 'offer' && (
        <div className="mb-3 rounded border-2 border-caution bg-caution/10 p-3 text-sm" data-testid="draft-offer" role="status">
          <p>Unsaved edits from {pending.draft.savedAt.replace('T', ' ').slice(0, 16)} UTC are kept in this browser.</p>
          <div className="mt-2 flex gap-2">
            <Button onClick={() => adopt(pending.draft.inputs, 'Your unsaved edits are back: save them to keep them.')}>Restore my unsaved edits</Button>
            <Button tone="danger" onClick={() => { clearDraft(r.id); setPending(null); }}>Discard them</Button>
          </div>
        </div>
      )}
      {pending?.kind === 'conflict' && (
        <div className="mb-3">
          <ConflictView base={pending.draft.base} mine={pending.draft.inputs} theirs={r.inputs} onResolve={(merged) => adopt(merged, 'The merged values are in the form: check them and save.')} onDiscardMine={() => { clearDraft(r.id); setPending(null); }} />
        </div>
      )}
      <form noValidate onSubmit={handleSubmit((v) => save.mutate(v), onInvalid)} className="space-y-4" aria-label="Study editor" data-ready={ready ? 'true' : 'false'}>
        {notes.length > 0 && (
          <div role="status" className="rounded border border-copper bg-copper-light/30 px-3 py-2 text-sm" data-testid="edit-notes">
            <ul className="list-disc pl-5">{notes.map((n) => <li key={n}>{n}</li>)}</ul>
            <button type="button" className="text-xs underline" onClick={() => setNotes([])}>Dismiss</button>
          </div>
        )}
        <fieldset disabled={lock} className="space-y-4">{children(setNotes)}</fieldset>
        {!readOnly && (
          <div className="sticky bottom-0 space-y-2 border-t border-rule bg-paper py-3">
            <ErrorList errors={formState.errors} values={getValues()} />
            <div className="flex flex-wrap items-center gap-3">
              <Button type="submit" disabled={lock || save.isPending}>{save.isPending ? 'Saving…' : 'Save inputs'}</Button>
              <Button tone="plain" disabled={lock || calculate.isPending || formState.isDirty} onClick={() => calculate.mutate()}>{calculate.isPending ? 'Calculating…' : 'Calculate'}</Button>
              {calculate.isPending && <Busy label="Solving every case…" />}
              {formState.isDirty && <span className="text-sm text-caution" data-testid="unsaved">Unsaved changes (kept in this browser{storageRefused ? ' — the browser refused to keep them: save soon' : ''}): save before calculating.</span>}
              {!formState.isDirty && r.results && r.resultsInputsHash === r.inputsHash && <span className="text-sm text-pass" data-testid="calculated">Results are current for these inputs: see the results and the checklist.</span>}
              {!formState.isDirty && calculate.data?.unchanged && calculate.data.inputsHash === r.inputsHash && <span className="text-sm text-ink-soft" role="status" data-testid="calculation-unchanged">Nothing had changed since the last calculation (inputs, engine version, limit set): the results stand as they were.</span>}
              {!formState.isDirty && r.results && r.resultsInputsHash !== r.inputsHash && <span className="text-sm text-caution">Inputs changed since the last calculation: calculate again.</span>}
              <ErrorNote error={save.error && !(save.error instanceof ApiError && save.error.status === 409) ? save.error : calculate.error} />
            </div>
          </div>
        )}
      </form>
    </FormProvider>
  );
}
