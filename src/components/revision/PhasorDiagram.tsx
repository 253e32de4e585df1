import type { PointResult } from '../../lib/calc/bonding/results';

const COLOURS = ['#a4522a', '#1f5f8b', '#2f6b3a', '#7a4ca0', '#b07d00', '#4a5668'];

/** Sheath-voltage phasors at one point, drawn to a common scale. */
export default function PhasorDiagram({ point }: { point: PointResult }) {
  const size = 220;
  const c = size / 2;
  const max = Math.max(...point.sheathEnds.map((e) => e.voltageV), 1e-9);
  return (
    <figure className="inline-block">
      <svg width={size} height={size} role="img" aria-label={`Sheath voltage phasors at ${point.label}`}>
        <circle cx={c} cy={c} r={c - 10} fill="none" stroke="#e4dfd4" />
        <line x1={10} x2={size - 10} y1={c} y2={c} stroke="#e4dfd4" />
        <line y1={10} y2={size - 10} x1={c} x2={c} stroke="#e4dfd4" />
        {point.sheathEnds.map((e, i) => {
          const r = ((c - 14) * e.voltageV) / max;
          const t = (e.angleDeg * Math.PI) / 180;
          const x = c + r * Math.cos(t);
          const y = c - r * Math.sin(t);
          return (
            <g key={`${e.cable}${e.side}`} stroke={COLOURS[i % COLOURS.length]} fill={COLOURS[i % COLOURS.length]}>
              <line x1={c} y1={c} x2={x} y2={y} strokeWidth={2.5} />
              <circle cx={x} cy={y} r={3.5} />
              <text x={x + 4} y={y - 4} fontSize={11} stroke="none">{e.cable}</text>
            </g>
          );
        })}
      </svg>
      <figcaption className="text-xs text-ink-soft">{point.label}: scale {max.toFixed(1)} V to the circle</figcaption>
    </figure>
  );
}
