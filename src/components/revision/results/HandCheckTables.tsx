import type { BondingResults, CaseResult } from '../../../lib/calc/bonding/results';
import { formatQuantity } from '../../../lib/format';

// Figures a checker reproduces by hand: the impedance matrix of each cross-section and, per
// case, the induced EMF and sheath current per kA. Results from engine 1 have neither.

const complexText = ([re, im]: [number, number]) => `${re.toFixed(5)} ${im < 0 ? '−' : '+'} j${Math.abs(im).toFixed(5)}`;

export function ImpedanceMatrices({ results }: { results: BondingResults }) {
  if (!results.impedanceMatrices?.length) return null;
  return (
    <details className="text-sm" data-testid="impedance-matrices">
      <summary className="cursor-pointer font-semibold">Per-kilometre impedance matrices with earth return (Ω/km)</summary>
      {results.impedanceMatrices.map((m) => (
        <div key={m.crossSection} className="mt-2 overflow-x-auto">
          <p className="text-xs text-ink-soft">{m.crossSection}; sections {m.sectionIds.join(', ')}. Carson's equations, simplified (IEEE Std 367).</p>
          <table className="text-xs">
            <thead className="bg-copper-light text-left"><tr><th className="px-1" />{m.conductors.map((c) => <th key={c} className="px-1">{c}</th>)}</tr></thead>
            <tbody>{m.impedanceOhmPerKm.map((row, i) => <tr key={m.conductors[i]} className="border-t border-rule"><th className="px-1 text-left">{m.conductors[i]}</th>{row.map((z, j) => <td key={j} className="px-1 font-mono">{complexText(z)}</td>)}</tr>)}</tbody>
          </table>
        </div>
      ))}
    </details>
  );
}

export function CaseHandCheckTable({ result }: { result: CaseResult }) {
  const hc = result.handCheck;
  if (!hc || hc.referenceCurrentA === 0) return null;
  return (
    <table className="w-full text-sm" data-testid="hand-check">
      <caption className="mb-1 text-left text-xs text-ink-soft">Per kA of the case's largest core current ({formatQuantity(hc.referenceCurrentA, 'A')}). EMF: open-circuit, along each sheath.</caption>
      <thead className="bg-copper-light text-left"><tr><th className="px-2 py-1">Cable</th><th className="px-2 py-1">Cross-section</th><th className="px-2 py-1">EMF (V/km per kA)</th><th className="px-2 py-1">Largest sheath current (A per kA)</th></tr></thead>
      <tbody>
        {hc.emfVPerKmPerKA.map((e) => (
          <tr key={`${e.crossSection}|${e.cable}`} className="border-t border-rule">
            <td className="px-2 py-1">{e.cable}</td>
            <td className="px-2 py-1">{e.crossSection}</td>
            <td className="px-2 py-1 font-mono">{formatQuantity(e.value)}</td>
            <td className="px-2 py-1 font-mono">{formatQuantity(hc.sheathCurrentAPerKA.find((s) => s.cable === e.cable)?.value ?? 0)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
