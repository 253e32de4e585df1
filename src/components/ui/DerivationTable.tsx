import { sig, type DerivedFigure } from '../../lib/calc/cable/derive-cable';

/** Derived figures, each with its formula, the numbers put in, and its source. */
export default function DerivationTable({ figures, caption, testId, className = '' }: { figures: DerivedFigure[]; caption: string; testId: string; className?: string }) {
  return (
    <table className={`w-full text-xs ${className}`} data-testid={testId}>
      <caption className="py-1 text-left text-ink-soft">{caption}</caption>
      <thead className="text-left text-ink-soft">
        <tr><th>Figure</th><th>Value</th><th>Formula</th><th>Working</th><th>Source</th></tr>
      </thead>
      <tbody>
        {figures.map((f) => (
          <tr key={f.key} className="border-t border-rule align-top">
            <td className="py-0.5 pr-2">{f.label}</td>
            <td className="pr-2 font-mono whitespace-nowrap">{sig(f.value)} {f.unit}</td>
            <td className="pr-2 font-mono">{f.formula}</td>
            <td className="pr-2 font-mono">{f.working}</td>
            <td>{f.source}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
