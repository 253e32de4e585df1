import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import { withQueryClient } from '../ui/with-query-client';
import { Busy, ErrorNote } from '../ui/parts';

type Settings = { appendValidation: boolean };
const KEY = ['admin', 'record-settings'];

/** The administrator's choice: records link to the engine's validation table, or append it. */
function RecordValidationSetting() {
  const queryClient = useQueryClient();
  const current = useQuery({ queryKey: KEY, queryFn: () => api<Settings>('/api/admin/record-settings') });
  const save = useMutation({
    mutationFn: (appendValidation: boolean) => api<Settings>('/api/admin/record-settings', { method: 'PUT', body: { appendValidation } }),
    onSuccess: (answer) => queryClient.setQueryData(KEY, answer),
  });
  return (
    <section className="mt-6 rounded-lg border border-rule bg-panel p-4" aria-labelledby="record-validation">
      <h2 id="record-validation" className="mb-2 text-lg font-semibold">Engine validation in records</h2>
      <p className="mb-2 text-sm text-ink-soft">Every record states its engine version and the summary of that version's validation ("n of n reference values within tolerance") with a link to the <a className="underline" href="/methods#validation">table</a>. Records issued from now on can carry the whole table as well; records already issued keep what they were issued with.</p>
      {current.isPending ? <Busy label="Loading…" /> : current.error ? <ErrorNote error={current.error} /> : (
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={current.data.appendValidation} disabled={save.isPending} onChange={(e) => save.mutate(e.target.checked)} />
          Append the full validation table to each record
        </label>
      )}
      {save.error && <ErrorNote error={save.error} />}
    </section>
  );
}

export default withQueryClient(RecordValidationSetting);
