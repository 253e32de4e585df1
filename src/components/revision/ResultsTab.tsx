import { useState } from 'react';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import type { BondingResults } from '../../lib/calc/bonding/results';
import type { ExposureResults } from '../../lib/calc/exposure/solve-exposure';
import { formatQuantity } from '../../lib/format';
import { quantityLabel } from '../../lib/compare/labels';
import { Caution, Empty } from '../ui/parts';
import { METHODS_PATH, methodEngineLabel, sectionHref } from '../../lib/methods/method-reference';
import type { Measurement } from './RouteProfileChart';
import RouteProfilePlot from './RouteProfilePlot';
import PhasorDiagram from './PhasorDiagram';
import PointVoltagesTable, { SvlTable } from './results/PointVoltagesTable';
import { CaseHandCheckTable, ImpedanceMatrices } from './results/HandCheckTables';

export default function ResultsTab({ detail, measurements }: { detail: RevisionDetail; measurements?: { caseId: string; rows: Measurement[] } }) {
  const results = detail.revision.results;
  if (!results) return <Empty>Not calculated yet. The designer calculates the revision from the study editor.</Empty>;
  const stale = detail.revision.resultsInputsHash !== detail.revision.inputsHash;
  return (
    <div className="space-y-4">
      <Caution />
      {stale && <p role="alert" className="rounded border border-fail bg-fail/10 px-3 py-2 text-sm text-fail">The inputs changed after this calculation: calculate again before submitting.</p>}
      <p className="text-xs text-ink-soft">
        Engine {detail.revision.engineVersion}; inputs hash {detail.revision.inputsHash.slice(0, 16)}…;{' '}
        <a className="underline" href={METHODS_PATH} data-testid="method-statement-link">method statement, engine {methodEngineLabel(detail.revision.engineVersion ?? undefined)}</a>,{' '}
        <a className="underline" href={`${METHODS_PATH}#validation`}>its validation</a>
      </p>
      {results.kind === 'bonding' ? <BondingResultsView results={results} detail={detail} measurements={measurements} /> : <ExposureResultsView results={results} />}
    </div>
  );
}

function BondingResultsView({ results, detail, measurements }: { results: BondingResults; detail: RevisionDetail; measurements?: { caseId: string; rows: Measurement[] } }) {
  const [caseId, setCaseId] = useState(results.cases[0]?.caseId);
  const c = results.cases.find((x) => x.caseId === caseId) ?? results.cases[0];
  const limit = detail.checklist.find((i) => i.itemKey === `standing-voltage-${c.kind}:${c.caseId}`)?.limitValue ?? null;
  const worstPoint = c.points.reduce((a, b) => (b.maxV > a.maxV ? b : a), c.points[0]);
  return (
    <>
      <section>
        <h3 className="mb-2 font-semibold">Worst values over all cases</h3>
        <table className="w-full text-sm" data-testid="worst-values">
          <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">Quantity</th><th className="px-2 py-1">Value</th><th className="px-2 py-1">Measured</th><th className="px-2 py-1">Case</th><th className="px-2 py-1">Where</th></tr></thead>
          <tbody>{results.worst.map((w) => <tr key={w.quantity} className="border-t border-rule"><td className="px-2 py-1">{quantityLabel(w.quantity)}</td><td className="px-2 py-1 font-mono">{formatQuantity(w.value, w.unit)}</td><td className="px-2 py-1">{w.reference ?? (w.unit === 'V' ? 'to remote earth' : '')}</td><td className="px-2 py-1">{w.caseId}</td><td className="px-2 py-1">{w.where}</td></tr>)}</tbody>
        </table>
      </section>
      <section>
        <label className="text-sm font-semibold">Case <select aria-label="Case" className="ml-2 rounded border border-rule bg-panel px-2 py-1" value={c.caseId} onChange={(e) => setCaseId(e.target.value)}>{results.cases.map((x) => <option key={x.caseId} value={x.caseId}>{x.caseId}: {x.name}</option>)}</select></label>
        <p className="text-xs text-ink-soft">Route plot: sheath and ECC voltages to remote earth.</p>
        <RouteProfilePlot revisionId={detail.revision.id} result={c} limitV={limit} measurements={measurements?.caseId === c.caseId ? measurements.rows : []} />
      </section>
      <section className="flex flex-wrap gap-6">
        {worstPoint && <PhasorDiagram point={worstPoint} />}
        <PointVoltagesTable result={c} />
      </section>
      {c.svls.length > 0 && (
        <section>
          <h3 className="mb-2 font-semibold">Sheath voltage limiters</h3>
          <SvlTable result={c} jointNames={(detail.revision.inputs as { jointNames?: Array<{ jointIndex: number; name: string }> } | null)?.jointNames} />
        </section>
      )}
      <section>
        <h3 className="mb-2 font-semibold">Sheath currents and loss factors</h3>
        <table className="w-full text-sm">
          <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">Cable</th><th className="px-2 py-1">Largest sheath current</th><th className="px-2 py-1">Loss factor λ1'</th></tr></thead>
          <tbody>{c.sheathCurrents.map((s) => <tr key={s.cable} className="border-t border-rule"><td className="px-2 py-1">{s.cable}</td><td className="px-2 py-1 font-mono">{formatQuantity(s.maxA, 'A')}</td><td className="px-2 py-1 font-mono">{(() => { const l = c.lossFactors.find((x) => x.cable === s.cable); return l ? formatQuantity(l.lossFactor) : '—'; })()}</td></tr>)}</tbody>
        </table>
      </section>
      <section>
        <h3 className="mb-2 font-semibold">Hand-check figures</h3>
        <CaseHandCheckTable result={c} />
        <ImpedanceMatrices results={results} />
      </section>
      {results.crossChecks.length > 0 && (
        <section>
          <h3 className="mb-2 font-semibold">Closed-form cross-check beside the network solution <a className="text-xs font-normal underline" href={sectionHref('7')}>(method, section 7)</a></h3>
          <table className="w-full text-sm" data-testid="cross-checks">
            <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">Quantity</th><th className="px-2 py-1">Case</th><th className="px-2 py-1">Closed form</th><th className="px-2 py-1">Network</th><th className="px-2 py-1">Difference</th></tr></thead>
            <tbody>{results.crossChecks.map((x) => <tr key={x.description + x.caseId} className="border-t border-rule"><td className="px-2 py-1">{x.description}</td><td className="px-2 py-1">{x.caseId}</td><td className="px-2 py-1 font-mono">{formatQuantity(x.closedForm, x.unit)}</td><td className="px-2 py-1 font-mono">{formatQuantity(x.network, x.unit)}</td><td className="px-2 py-1 font-mono">{x.differencePct.toExponential(1)} %</td></tr>)}</tbody>
          </table>
        </section>
      )}
    </>
  );
}

function ExposureResultsView({ results }: { results: ExposureResults }) {
  const th = 'px-2 py-1';
  return (
    <table className="w-full text-sm" data-testid="exposure-results">
      <thead className="bg-copper-light text-left">
        <tr>
          <th className={th}>Case</th>
          <th className={th}>EMF along the run (end to end, both ends open)</th>
          <th className={th}>Start to remote earth</th>
          <th className={th}>End to remote earth</th>
          <th className={th}>Tolerable touch</th>
          <th className={th}>Current in the metalwork</th>
        </tr>
      </thead>
      <tbody>
        {results.cases.map((c) => (
          <tr key={c.caseId} className="border-t border-rule">
            <td className={th}>{c.caseId}: {c.name}</td>
            <td className={`${th} font-mono`}>{formatQuantity(c.emfV, 'V')}</td>
            {/* The accessible end (the larger) is marked: it is the value the checks compare. */}
            <td className={`${th} font-mono ${c.accessibleAt === 'start' ? 'font-semibold' : ''}`}>{formatQuantity(c.startV, 'V')}</td>
            <td className={`${th} font-mono ${c.accessibleAt !== 'start' ? 'font-semibold' : ''}`}>{formatQuantity(c.endV, 'V')}</td>
            <td className={`${th} font-mono`}>{c.tolerable ? formatQuantity(c.tolerable.touchV, 'V') : '—'}</td>
            <td className={`${th} font-mono`}>{formatQuantity(c.currentA, 'A')}</td>
          </tr>
        ))}
      </tbody>
      <caption className="caption-bottom pt-1 text-left text-xs text-ink-soft">Voltages to remote earth; the larger end (bold) is the accessible voltage that the checks compare, a conservative touch voltage where the ground at that end is not raised.</caption>
    </table>
  );
}
