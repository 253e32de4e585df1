import type { CaseResult } from '../../../lib/calc/bonding/results';
import { formatQuantity } from '../../../lib/format';
import { jointInWords } from '../../../lib/calc/bonding/joint-names';

// Voltages at link boxes and route ends, each column naming its reference. Results from
// engine 1 carry no local-earth figures: those cells show a dash, and their voltages were
// all to remote earth.

const localEarthName = { 'station-grid': 'station grid', 'link-box-electrode': 'link-box electrode', 'no-electrode': 'no electrode' } as const;

export default function PointVoltagesTable({ result }: { result: CaseResult }) {
  return (
    <table className="flex-1 text-sm" data-testid="point-voltages">
      <caption className="mb-1 text-left text-xs text-ink-soft">
        “To local earth”: sheath end to the earth at that point (link-box electrode or station grid), what a person there or an SVL to earth sees. “To remote earth”: to earth far away. “Across joint”: sheath end to sheath end. “Local earth rise”: the local earth to remote earth.
      </caption>
      <thead className="bg-copper-light text-left">
        <tr>
          <th className="px-2 py-1">Point</th>
          <th className="px-2 py-1">Local earth</th>
          <th className="px-2 py-1">Highest sheath V to local earth</th>
          <th className="px-2 py-1">Highest sheath V to remote earth</th>
          <th className="px-2 py-1">Across joint V</th>
          <th className="px-2 py-1">Local earth rise V (to remote earth)</th>
        </tr>
      </thead>
      <tbody>
        {result.points.map((p) => (
          <tr key={p.label} className="border-t border-rule">
            <td className="px-2 py-1">{p.label}</td>
            <td className="px-2 py-1">{p.localEarth ? `${localEarthName[p.localEarth.kind]}${p.localEarth.resistanceOhm === null ? '' : `, ${formatQuantity(p.localEarth.resistanceOhm, 'Ω')}`}` : '—'}</td>
            <td className="px-2 py-1 font-mono">{p.maxToLocalEarthV === undefined || p.maxToLocalEarthV === null ? '—' : formatQuantity(p.maxToLocalEarthV, 'V')}</td>
            <td className="px-2 py-1 font-mono">{formatQuantity(p.maxV, 'V')}</td>
            <td className="px-2 py-1 font-mono">{p.acrossJoint.length ? formatQuantity(Math.max(...p.acrossJoint.map((a) => a.voltageV)), 'V') : '—'}</td>
            <td className="px-2 py-1 font-mono">{p.earthBarV === undefined ? '—' : formatQuantity(p.earthBarV, 'V')}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** SVL voltages of a case; joints are told by their bay names where the inputs give them. */
export function SvlTable({ result, jointNames }: { result: CaseResult; jointNames?: Array<{ jointIndex: number; name: string }> }) {
  if (!result.svls.length) return null;
  return (
    <table className="w-full text-sm" data-testid="svl-voltages">
      <thead className="bg-copper-light text-left">
        <tr>
          <th className="px-2 py-1">SVL</th>
          <th className="px-2 py-1">Cable</th>
          <th className="px-2 py-1">Connected between</th>
          <th className="px-2 py-1">Voltage across its terminals</th>
          <th className="px-2 py-1">Current</th>
          <th className="px-2 py-1">Continuous / TOV rating</th>
        </tr>
      </thead>
      <tbody>
        {result.svls.map((s, i) => (
          <tr key={`${s.svlIndex}-${s.cable}-${i}`} className="border-t border-rule">
            <td className="px-2 py-1">SVL {s.svlIndex + 1}, {jointInWords({ jointNames }, s.jointIndex)}</td>
            <td className="px-2 py-1">{s.cable}</td>
            <td className="px-2 py-1">{s.terminals ?? (s.connection === 'across-joint' ? 'across the joint' : 'sheath to remote earth (engine 1)')}</td>
            <td className="px-2 py-1 font-mono">{formatQuantity(s.voltageV, 'V')}</td>
            <td className="px-2 py-1 font-mono">{s.conducting ? formatQuantity(s.currentA, 'A') : 'blocking'}</td>
            <td className="px-2 py-1 font-mono">{formatQuantity(s.continuousRatingV, 'V')} / {formatQuantity(s.tovRatingV, 'V')}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
