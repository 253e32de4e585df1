import type { BondingStudyInput } from '../../lib/schemas/bonding-study.schema';
import { cablePositions } from '../../lib/calc/bonding/cross-section';

type Layout = NonNullable<BondingStudyInput['layouts']>[number];

/** The formation drawn to scale: cables as circles of their overall diameter, ECCs as dots, ground at the top. */
export default function CrossSectionSketch({ layout, cableTypes, circuits }: { layout: Layout; cableTypes: BondingStudyInput['cableTypes']; circuits: BondingStudyInput['circuits'] }) {
  const cables = layout.circuits.flatMap((p) => {
    const circuit = circuits.find((c) => c.id === p.circuitId);
    const type = cableTypes.find((t) => t.id === circuit?.cableTypeId);
    const r = (Number(type?.overallDiameterMm) || 100) / 2000;
    try {
      const placed = cablePositions({ centreXM: 0, ...p } as never);
      return placed.map((q, k) => ({ x: Number(q.xM), y: Number(q.depthM), r, label: `${p.circuitId}-${'abc'[k]}` }));
    } catch {
      return [];
    }
  });
  const eccs = (layout.eccs ?? []).map((e) => ({ x: Number(e.xM), y: Number(e.depthM), label: e.eccId }));
  const xs = [...cables.map((c) => c.x), ...eccs.map((e) => e.x)].filter(Number.isFinite);
  const ys = [...cables.map((c) => c.y), ...eccs.map((e) => e.y)].filter(Number.isFinite);
  if (!xs.length) return <p className="text-sm text-ink-soft">Place a circuit to see the sketch.</p>;
  const pad = 0.3;
  const minX = Math.min(...xs) - pad;
  const maxX = Math.max(...xs) + pad;
  const maxY = Math.max(...ys) + pad;
  const w = 320;
  const scale = w / Math.max(maxX - minX, maxY);
  const h = maxY * scale + 10;
  return (
    <figure data-testid="cross-section-sketch">
      <svg width={w} height={h} role="img" aria-label={`Cross-section of layout ${layout.id}, to scale`} className="rounded border border-rule bg-panel">
        <rect x={0} y={0} width={w} height={4} fill="#8a7a5a" />
        {cables.map((c) => (
          <g key={c.label}>
            <circle cx={(c.x - minX) * scale} cy={c.y * scale} r={Math.max(c.r * scale, 1.5)} fill="#a4522a" stroke="#16202e" />
            <text x={(c.x - minX) * scale} y={c.y * scale - c.r * scale - 3} fontSize={9} textAnchor="middle">{c.label}</text>
          </g>
        ))}
        {eccs.map((e) => <circle key={e.label} cx={(e.x - minX) * scale} cy={e.y * scale} r={3} fill="#2f6b3a"><title>{e.label}</title></circle>)}
      </svg>
      <figcaption className="text-xs text-ink-soft">Drawn to scale: {(1 / scale * 100).toFixed(1)} m per 100 px; ground surface at the top.</figcaption>
    </figure>
  );
}
