import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { ApiError, api } from '../../lib/queries/api-client';
import { projectAssetsQuery } from '../../lib/queries/register.queries';
import { isoDateOrNull } from '../../lib/format';
import { readNumber } from '../../lib/paste/read-number';
import { Button, ErrorNote } from '../ui/parts';
import { FormField } from '../ui/FormField';

interface Latest {
  threePhaseFaultKa: number | null;
  earthFaultKa: number | null;
  clearanceTimeS: number | null;
  gridResistanceOhm: number | null;
}

const NUMBERS = ['earthFaultKa', 'threePhaseFaultKa', 'clearanceTimeS', 'gridResistanceOhm', 'maxLoadA'] as const;
type NumberField = (typeof NUMBERS)[number];

/**
 * The figures as typed, read as numbers (a decimal comma is fine), or an error per field. A figure
 * that cannot be read is refused here: sent on, it would become null, which means "not given".
 */
function readFigures(form: Record<NumberField, string>) {
  const values = {} as Record<NumberField, number | null>;
  const errors: Partial<Record<string, string>> = {};
  for (const key of NUMBERS) {
    const reading = readNumber(form[key]);
    if ('error' in reading) errors[key] = reading.error;
    else values[key] = 'empty' in reading ? null : reading.value;
  }
  return { values, errors };
}

/** The server's field names as this form's (one maximum load at most). */
const formField = (field: string) => field.replace(/^maxLoads\.0\./, '');

/** Publishes a new version of the site's system data; the answer lists the studies it put under review. */
export default function SystemDataForm({ site, latest }: { site: { id: string; projectId: string }; latest?: Latest }) {
  const client = useQueryClient();
  const circuits = useQuery(projectAssetsQuery(site.projectId));
  const text = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));
  const [f, setF] = useState({ earthFaultKa: text(latest?.earthFaultKa), threePhaseFaultKa: text(latest?.threePhaseFaultKa), clearanceTimeS: text(latest?.clearanceTimeS), gridResistanceOhm: text(latest?.gridResistanceOhm), circuitAssetId: '', maxLoadA: '', source: '', sourceDate: '' });
  const [localErrors, setLocalErrors] = useState<Partial<Record<string, string>>>({});
  const publish = useMutation({
    mutationFn: (values: Record<NumberField, number | null>) =>
      api<{ version: { version: number }; flagged: Array<{ studyCode: string; revisionNumber: number; reasons: string[] }> }>(`/api/assets/${site.id}/system-data`, {
        method: 'POST',
        body: {
          earthFaultKa: values.earthFaultKa,
          threePhaseFaultKa: values.threePhaseFaultKa,
          clearanceTimeS: values.clearanceTimeS,
          gridResistanceOhm: values.gridResistanceOhm,
          maxLoads: f.circuitAssetId && values.maxLoadA !== null ? [{ circuitAssetId: f.circuitAssetId, maxLoadA: values.maxLoadA }] : [],
          source: f.source,
          sourceDate: isoDateOrNull(f.sourceDate) ?? f.sourceDate,
        },
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['register'] }),
  });
  const submit = () => {
    const { values, errors } = readFigures(f);
    // A maximum load belongs to a circuit: one without the other would be lost on the way.
    if (values.maxLoadA !== null && values.maxLoadA !== undefined && !f.circuitAssetId) errors.circuitAssetId = 'Choose the circuit this maximum load is for.';
    if (f.circuitAssetId && !errors.maxLoadA && values.maxLoadA === null) errors.maxLoadA = 'Give the maximum load of the circuit chosen, or choose none.';
    setLocalErrors(errors);
    if (Object.keys(errors).length === 0) publish.mutate(values);
    else publish.reset();
  };
  const serverErrors = publish.error instanceof ApiError ? Object.fromEntries(publish.error.fields.map((e) => [formField(e.field), e.message])) : {};
  const errorOf = (key: string) => localErrors[key] ?? serverErrors[key];
  const input = 'mt-1 block w-full rounded border border-rule bg-panel px-2 py-1';
  const field = (key: keyof typeof f, label: string) => (
    <FormField label={label} error={errorOf(key)}>
      {(c) => <input {...c} className={input} value={f[key]} onChange={(e) => setF((x) => ({ ...x, [key]: e.target.value }))} />}
    </FormField>
  );
  return (
    <div className="mt-3 space-y-2 rounded border border-rule p-3 text-sm">
      <p className="font-semibold">Publish a new version</p>
      <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
        {field('earthFaultKa', 'Earth-fault level (kA)')}
        {field('threePhaseFaultKa', 'Three-phase fault level (kA)')}
        {field('clearanceTimeS', 'Fault clearance time (s)')}
        {field('gridResistanceOhm', 'Earth grid resistance (Ω)')}
        <FormField label="Circuit for a maximum load" error={errorOf('circuitAssetId')}>
          {(c) => (
            <select {...c} className={input} value={f.circuitAssetId} onChange={(e) => setF((x) => ({ ...x, circuitAssetId: e.target.value }))}>
              <option value="">none</option>
              {circuits.data?.assets.filter((a) => a.kind === 'circuit').map((a) => <option key={a.id} value={a.id}>{a.code}</option>)}
            </select>
          )}
        </FormField>
        {field('maxLoadA', 'Maximum load (A)')}
        {field('source', 'Source of the figures')}
        {field('sourceDate', 'Source date (YYYY-MM-DD)')}
      </div>
      <Button disabled={publish.isPending} onClick={submit}>Publish the version</Button>
      {Object.keys(localErrors).length > 0 && <p role="alert" className="text-fail">Nothing was published: put right the figures marked above.</p>}
      {publish.error && <ErrorNote error={publish.error} />}
      {publish.data && (
        <div role="status" className="rounded border border-rule bg-paper p-2">
          <p className="font-semibold">Version {publish.data.version.version} published. {publish.data.flagged.length ? 'Now needing review:' : 'No issued study is made non-conservative by it.'}</p>
          <ul className="list-disc pl-5">
            {publish.data.flagged.map((x) => <li key={x.studyCode}>{x.studyCode} rev {x.revisionNumber}: {x.reasons.join(' ')}</li>)}
          </ul>
        </div>
      )}
    </div>
  );
}
