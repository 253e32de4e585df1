import { useQuery } from '@tanstack/react-query';
import { assetQuery } from '../../lib/queries/register.queries';
import { Busy, Button, Caution, ErrorNote } from '../ui/parts';
import RecordObligationForm from './RecordObligationForm';
import StudyLinkForm from './StudyLinkForm';
import SystemDataForm from './SystemDataForm';

const withUnit = (v: number | null, unit: string) => (v === null ? '—' : `${v} ${unit}`);

const interval = (months: number | null) => (months === null ? 'once' : months % 12 === 0 ? `every ${months / 12} year${months === 12 ? '' : 's'}` : `every ${months} months`);

/** One asset: the studies covering it, what it owes and when, its records with evidence, and (sites) its system data. */
export default function AssetPanel({ assetId, roles, onClose }: { assetId: string; roles: Record<string, string[]>; onClose: () => void }) {
  const { data, isPending, error } = useQuery(assetQuery(assetId));
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
        <Button tone="plain" className="ml-auto" onClick={onClose}>Close</Button>
      </div>
      <Caution />

      <div>
        <h3 className="font-semibold">Studies covering it</h3>
        {data.studies.length === 0 ? <p className="text-sm text-ink-soft">No study is linked yet.</p> : (
          <ul className="list-disc pl-5 text-sm">
            {data.studies.map((s) => (
              <li key={s.studyId}>
                <a className="font-semibold text-copper hover:underline" href={`/studies/${s.studyId}`}>{s.code}</a> {s.title}
                {s.revisionNumber !== null && <span className="text-ink-soft"> (latest revision {s.revisionNumber}, {s.state?.replace(/_/g, ' ')})</span>}
                {s.studyCircuitId && <span className="text-ink-soft"> · circuit {s.studyCircuitId} in the study</span>}
                {s.siteEnd && <span className="text-ink-soft"> · at the route {s.siteEnd}</span>}
              </li>
            ))}
          </ul>
        )}
        {can('designer', 'approver') && <StudyLinkForm asset={asset} />}
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
