import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import { projectAssetsQuery } from '../../lib/queries/register.queries';
import { isoDateOrNull } from '../../lib/format';
import { Button, ErrorNote } from '../ui/parts';

interface Latest {
  threePhaseFaultKa: number | null;
  earthFaultKa: number | null;
  clearanceTimeS: number | null;
  gridResistanceOhm: number | null;
}

const num = (s: string) => (s.trim() === '' ? null : Number(s));

/** Publishes a new version of the site's system data; the answer lists the studies it put under review. */
export default function SystemDataForm({ site, latest }: { site: { id: string; projectId: string }; latest?: Latest }) {
  const client = useQueryClient();
  const circuits = useQuery(projectAssetsQuery(site.projectId));
  const text = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));
  const [f, setF] = useState({ earthFaultKa: text(latest?.earthFaultKa), threePhaseFaultKa: text(latest?.threePhaseFaultKa), clearanceTimeS: text(latest?.clearanceTimeS), gridResistanceOhm: text(latest?.gridResistanceOhm), circuitAssetId: '', maxLoadA: '', source: '', sourceDate: '' });
  const publish = useMutation({
    mutationFn: () =>
      api<{ version: { version: number }; flagged: Array<{ studyCode: string; revisionNumber: number; reasons: string[] }> }>(`/api/assets/${site.id}/system-data`, {
        method: 'POST',
        body: {
          earthFaultKa: num(f.earthFaultKa),
          threePhaseFaultKa: num(f.threePhaseFaultKa),
          clearanceTimeS: num(f.clearanceTimeS),
          gridResistanceOhm: num(f.gridResistanceOhm),
          maxLoads: f.circuitAssetId && f.maxLoadA ? [{ circuitAssetId: f.circuitAssetId, maxLoadA: Number(f.maxLoadA) }] : [],
          source: f.source,
          sourceDate: isoDateOrNull(f.sourceDate) ?? f.sourceDate,
        },
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['register'] }),
  });
  const input = 'mt-1 block w-full rounded border border-rule bg-panel px-2 py-1';
  const field = (key: keyof typeof f, label: string) => (
    <label>{label}<input aria-label={label} className={input} value={f[key]} onChange={(e) => setF((x) => ({ ...x, [key]: e.target.value }))} /></label>
  );
  return (
    <div className="mt-3 space-y-2 rounded border border-rule p-3 text-sm">
      <p className="font-semibold">Publish a new version</p>
      <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
        {field('earthFaultKa', 'Earth-fault level (kA)')}
        {field('threePhaseFaultKa', 'Three-phase fault level (kA)')}
        {field('clearanceTimeS', 'Fault clearance time (s)')}
        {field('gridResistanceOhm', 'Earth grid resistance (Ω)')}
        <label>Circuit for a maximum load
          <select className={input} value={f.circuitAssetId} onChange={(e) => setF((x) => ({ ...x, circuitAssetId: e.target.value }))}>
            <option value="">none</option>
            {circuits.data?.assets.filter((a) => a.kind === 'circuit').map((a) => <option key={a.id} value={a.id}>{a.code}</option>)}
          </select>
        </label>
        {field('maxLoadA', 'Maximum load (A)')}
        {field('source', 'Source of the figures')}
        {field('sourceDate', 'Source date (YYYY-MM-DD)')}
      </div>
      <Button disabled={publish.isPending} onClick={() => publish.mutate()}>Publish the version</Button>
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
