import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import { assetQuery } from '../../lib/queries/register.queries';
import { Busy, Button, Caution, ErrorNote } from '../ui/parts';
import AssetEditForm from './AssetEditForm';
import RecordObligationForm from './RecordObligationForm';
import StudyLinkForm from './StudyLinkForm';
import StudyLinkRow from './StudyLinkRow';
import SystemDataForm from './SystemDataForm';

const withUnit = (v: number | null, unit: string) => (v === null ? '—' : `${v} ${unit}`);

const interval = (months: number | null) => (months === null ? 'once' : months % 12 === 0 ? `every ${months / 12} year${months === 12 ? '' : 's'}` : `every ${months} months`);

/** One asset: the studies covering it, what it owes and when, its records with evidence, and (sites) its system data. */
export default function AssetPanel({ assetId, roles, onClose }: { assetId: string; roles: Record<string, string[]>; onClose: () => void }) {
  const { data, isPending, error } = useQuery(assetQuery(assetId));
  const client = useQueryClient();
  const [editing, setEditing] = useState(false);
  const [confirmingRemoval, setConfirmingRemoval] = useState(false);
  const remove = useMutation({
    mutationFn: () => api(`/api/assets/${assetId}`, { method: 'DELETE' }),
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: ['register'] });
      onClose();
    },
  });
  if (error) return <ErrorNote error={error} />;
  if (isPending) return <Busy label="Loading the asset…" />;
  const { asset } = data;
  const mine = roles[asset.projectId] ?? [];
  const can = (...r: string[]) => mine.some((x) => r.includes(x));
  const th = 'px-3 py-1.5 text-left font-semibold';
  const td = 'px-3 py-1.5';
  return (
    <section aria-label={`Asset ${asset.code}`} data-testid="asset-panel" className="space-y-4 rounded-lg border border-copper bg-panel p-4">
      <div className="flex items-start gap-3">
        <div>
          <h2 className="text-lg font-bold">{asset.code} {asset.name}</h2>
          <p className="text-sm text-ink-soft">
            {asset.kind === 'site' ? `Site (${asset.siteKind})` : 'Circuit'}{asset.route ? `, ${asset.route}` : ''} · {asset.ownerStandard} · in service {asset.inServiceOn ?? 'date not given'}
          </p>
        </div>
        <div className="ml-auto flex gap-2">
          {can('designer', 'approver') && !asset.removedAt && !editing && <Button tone="plain" onClick={() => setEditing(true)}>Change details</Button>}
          {can('designer', 'approver') && !asset.removedAt && !confirmingRemoval && <Button tone="plain" onClick={() => setConfirmingRemoval(true)}>Remove from the register</Button>}
          <Button tone="plain" onClick={onClose}>Close</Button>
        </div>
      </div>
      {asset.removedAt && <p role="status" className="text-sm font-semibold text-fail">Removed from the register on {asset.removedAt.slice(0, 10)}; its records are kept.</p>}
      {confirmingRemoval && (
        <div role="group" aria-label={`Remove ${asset.code}`} className="flex flex-wrap items-center gap-3 rounded border border-fail p-3 text-sm">
          <span>{asset.code} leaves the register: its study links and what it owes go, no more reminders are sent, and its code is free again. Its records, evidence and audit trail are kept.</span>
          <Button tone="danger" disabled={remove.isPending} onClick={() => remove.mutate()}>Remove {asset.code}</Button>
          <Button tone="plain" onClick={() => setConfirmingRemoval(false)}>Keep it</Button>
          {remove.error && <ErrorNote error={remove.error} />}
        </div>
      )}
      {editing && <AssetEditForm asset={asset} onDone={() => setEditing(false)} />}
      <Caution />

      <div>
        <h3 className="font-semibold">Studies covering it</h3>
        {data.studies.length === 0 ? <p className="text-sm text-ink-soft">No study is linked yet.</p> : (
          <ul className="list-disc pl-5 text-sm">
            {data.studies.map((s) => (
              <StudyLinkRow key={s.studyId} asset={asset} link={s} canChange={can('designer', 'approver') && !asset.removedAt} />
            ))}
          </ul>
        )}
        {can('designer', 'approver') && !asset.removedAt && <StudyLinkForm asset={asset} />}
      </div>

      <div>
        <h3 className="font-semibold">Obligations ({asset.ownerStandard})</h3>
        {data.obligations.length === 0 ? <p className="text-sm text-ink-soft">The owner standard sets no obligation for this kind of asset yet.</p> : (
          <table className="w-full text-sm" data-testid="obligations">
            <thead className="bg-copper-light"><tr><th className={th}>Obligation</th><th className={th}>Interval</th><th className={th}>Criterion</th><th className={th}>Last done</th><th className={th}>Next due (UTC)</th></tr></thead>
            <tbody>
              {data.obligations.map((o) => (
                <tr key={o.type.id} className="border-t border-rule">
                  <td className={td}>{o.type.name}<div className="text-xs text-ink-soft">{o.type.basis}</div></td>
                  <td className={td}>{interval(o.type.intervalMonths)}</td>
                  <td className={td}>{o.type.criterion ? `${o.type.criterion.quantity} ${o.type.criterion.comparison === 'at-least' ? '≥' : '≤'} ${o.type.criterion.limit} ${o.type.criterion.unit}` : 'done or not'}</td>
                  <td className={td}>{o.lastDoneOn ? `${o.lastDoneOn} (${o.lastResult})` : '—'}</td>
                  <td className={td}>{o.nextDueOn ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {can('designer', 'checker', 'approver') && data.obligations.length > 0 && <RecordObligationForm assetId={asset.id} obligations={data.obligations.map((o) => o.type)} />}
      </div>

      {data.records.length > 0 && (
        <div>
          <h3 className="font-semibold">Records</h3>
          <table className="w-full text-sm" data-testid="records">
            <thead className="bg-copper-light"><tr><th className={th}>Done on</th><th className={th}>Obligation</th><th className={th}>By</th><th className={th}>Values</th><th className={th}>Result</th><th className={th}>Evidence</th><th className={th}>Remarks</th></tr></thead>
            <tbody>
              {data.records.map((r) => (
                <tr key={r.id} className="border-t border-rule">
                  <td className={td}>{r.doneOn}</td>
                  <td className={td}>{r.typeName}</td>
                  <td className={td}>{r.performedBy}<div className="text-xs text-ink-soft">recorded by {r.recordedByName}</div></td>
                  <td className={td}>{r.values.join(', ') || '—'}</td>
                  <td className={`${td} font-semibold ${r.result === 'fail' ? 'text-fail' : r.result === 'pass' ? 'text-pass' : ''}`}>{r.result}</td>
                  <td className={td}>{r.hasEvidence ? <a className="text-copper hover:underline" href={`/api/assets/${asset.id}/records/${r.id}/evidence`}>{r.evidenceName}</a> : '—'}</td>
                  <td className={td}>{r.remarks}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      {asset.kind === 'site' && (
        <div>
          <h3 className="font-semibold">System data</h3>
          {data.systemData.length === 0 ? <p className="text-sm text-ink-soft">No version published yet.</p> : (
            <table className="w-full text-sm" data-testid="system-data">
              <thead className="bg-copper-light"><tr><th className={th}>Version</th><th className={th}>Earth fault</th><th className={th}>Three-phase fault</th><th className={th}>Clearance</th><th className={th}>Grid</th><th className={th}>Maximum loads</th><th className={th}>Source</th></tr></thead>
              <tbody>
                {data.systemData.map((v) => (
                  <tr key={v.id} className="border-t border-rule">
                    <td className={td}>{v.version}</td>
                    <td className={td}>{withUnit(v.data.earthFaultKa, 'kA')}</td>
                    <td className={td}>{withUnit(v.data.threePhaseFaultKa, 'kA')}</td>
                    <td className={td}>{withUnit(v.data.clearanceTimeS, 's')}</td>
                    <td className={td}>{withUnit(v.data.gridResistanceOhm, 'Ω')}</td>
                    <td className={td}>{v.data.maxLoads.length ? `${v.data.maxLoads.length} circuit(s)` : '—'}</td>
                    <td className={td}>{v.source} ({v.sourceDate})</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          {can('approver') && <SystemDataForm site={asset} latest={data.systemData[0]?.data} />}
        </div>
      )}
    </section>
  );
}
