import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { ApiError, api } from '../../lib/queries/api-client';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import type { RevisionFile } from '../../lib/db/schema';
import type { Comparison } from '../../lib/files/measurements';
import type { BondingResults } from '../../lib/calc/bonding/results';
import { formatQuantity } from '../../lib/format';
import { Busy, Button, Empty, ErrorNote, formatDate } from '../ui/parts';
import RouteProfilePlot from './RouteProfilePlot';

const KIND_LABEL: Record<string, string> = { 'data-sheet': 'Data sheet', drawing: 'Drawing', measurements: 'Commissioning measurements (CSV)', other: 'Other' };

/** Files attached to the revision: upload, list, download; measurements compared with the calculation. */
export default function FilesTab({ detail, canUpload }: { detail: RevisionDetail; canUpload: boolean }) {
  const r = detail.revision;
  const queryClient = useQueryClient();
  const files = useQuery({ queryKey: ['revision', r.id, 'files'], queryFn: () => api<{ files: RevisionFile[] }>(`/api/revisions/${r.id}/files`) });
  const [kind, setKind] = useState('data-sheet');
  const [chosen, setChosen] = useState<File | null>(null);
  const [compareId, setCompareId] = useState<string | null>(null);
  const upload = useMutation({
    mutationFn: async () => {
      const body = new FormData();
      if (chosen) body.set('file', chosen);
      body.set('kind', kind);
      const res = await fetch(`/api/revisions/${r.id}/files`, { method: 'POST', body });
      const json = await res.json();
      if (!res.ok) throw new ApiError(res.status, json.error, json.message, json.fields);
      return json;
    },
    onSuccess: () => { setChosen(null); return queryClient.invalidateQueries({ queryKey: ['revision', r.id, 'files'] }); },
  });
  const comparison = useQuery({
    queryKey: ['file', compareId, 'comparison'],
    queryFn: () => api<{ caseId: string; rows: Comparison[] }>(`/api/files/${compareId}/comparison`),
    enabled: !!compareId,
  });
  const results = r.results?.kind === 'bonding' ? (r.results as BondingResults) : null;
  const compareCase = results?.cases.find((c) => c.caseId === comparison.data?.caseId);

  return (
    <div className="space-y-4">
      {files.isPending ? <Busy label="Loading files…" /> : files.data?.files.length ? (
        <table className="w-full text-sm" data-testid="files">
          <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">File</th><th className="px-2 py-1">What</th><th className="px-2 py-1">Type (by content)</th><th className="px-2 py-1">Size</th><th className="px-2 py-1">Added</th><th /></tr></thead>
          <tbody>{files.data.files.map((f) => (
            <tr key={f.id} className="border-t border-rule">
              <td className="px-2 py-1"><a className="text-copper underline" href={`/api/files/${f.id}`}>{f.fileName}</a></td>
              <td className="px-2 py-1">{KIND_LABEL[f.kind]}</td>
              <td className="px-2 py-1">{f.contentType}</td>
              <td className="px-2 py-1">{(f.sizeBytes / 1024).toFixed(1)} KiB</td>
              <td className="px-2 py-1">{formatDate(f.createdAt)}</td>
              <td className="px-2 py-1">{f.kind === 'measurements' && <Button tone="plain" onClick={() => setCompareId(f.id)}>Compare with the calculation</Button>}</td>
            </tr>
          ))}</tbody>
        </table>
      ) : <Empty>No files yet: attach data sheets, drawings and commissioning measurements here.</Empty>}

      {canUpload && (
        <form className="flex flex-wrap items-end gap-2 rounded border border-rule bg-panel p-3" aria-label="Upload a file" onSubmit={(e) => { e.preventDefault(); upload.mutate(); }}>
          <label className="text-sm">What is it<select aria-label="File kind" className="ml-1 rounded border border-rule px-1" value={kind} onChange={(e) => setKind(e.target.value)}>{Object.entries(KIND_LABEL).map(([k, v]) => <option key={k} value={k}>{v}</option>)}</select></label>
          <label className="text-sm">File<input aria-label="File to upload" type="file" className="ml-1" onChange={(e) => setChosen(e.target.files?.[0] ?? null)} /></label>
          <Button type="submit" disabled={upload.isPending}>{upload.isPending ? 'Uploading…' : 'Upload'}</Button>
          <p className="w-full text-xs text-ink-soft">Accepted by content: PDF, PNG, JPEG, Office files and CSV, up to 10 MiB. Measurement CSV columns: joint, cable, measured_v, load_a.</p>
          <div className="w-full"><ErrorNote error={upload.error} /></div>
        </form>
      )}

      {compareId && (comparison.isPending ? <Busy label="Comparing…" /> : comparison.error ? <ErrorNote error={comparison.error} /> : comparison.data && (
        <section data-testid="comparison">
          <h3 className="mb-1 font-semibold">Measured against calculated (case {comparison.data.caseId}, scaled to the load at the time)</h3>
          <table className="w-full text-sm">
            <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">Joint</th><th className="px-2 py-1">Cable</th><th className="px-2 py-1">Load</th><th className="px-2 py-1">Measured</th><th className="px-2 py-1">Calculated</th><th className="px-2 py-1">Deviation</th></tr></thead>
            <tbody>{comparison.data.rows.map((m, i) => (
              <tr key={i} className="border-t border-rule"><td className="px-2 py-1">{m.jointIndex}</td><td className="px-2 py-1">{m.cable}</td><td className="px-2 py-1">{m.loadCurrentA} A</td><td className="px-2 py-1 font-mono">{formatQuantity(m.measuredV, 'V')}</td><td className="px-2 py-1 font-mono">{m.calculatedV === null ? 'no such point' : formatQuantity(m.calculatedV, 'V')}</td><td className="px-2 py-1 font-mono">{m.deviationPct === null ? '—' : `${m.deviationPct.toFixed(1)} %`}</td></tr>
            ))}</tbody>
          </table>
          {compareCase && <RouteProfilePlot revisionId={r.id} result={compareCase} limitV={null} measurements={comparison.data.rows.filter((m) => m.chainageM !== null).map((m) => ({ chainageM: m.chainageM!, label: `${m.cable} at joint ${m.jointIndex}`, voltageV: (m.measuredV * m.caseCurrentA) / m.loadCurrentA }))} />}
          <p className="text-xs text-ink-soft">On the plot, each reading is scaled up from its load to the case current, so it sits on the same basis as the calculated curves.</p>
        </section>
      ))}
    </div>
  );
}
