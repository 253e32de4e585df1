import type { BondingStudyInput } from '../../lib/schemas/bonding-study.schema';
import { cablePositions } from '../../lib/calc/bonding/cross-section';
import { placeLabels } from './sketch-layout';

type Layout = NonNullable<BondingStudyInput['layouts']>[number];

const WIDTH_PX = 380;
const MARGIN_PX = 36;
const fmt = (m: number) => (Math.round(m * 1000) / 1000).toString();

/**
 * The formation drawn to scale and zoomed to its content: cables as circles of their overall
 * diameter, ECCs as dots, the ground line with its hatching, each circuit's depth, spacing and
 * offset dimensioned, every label placed clear of the others.
 */
export default function CrossSectionSketch({ layout, cableTypes, circuits }: { layout: Layout; cableTypes: BondingStudyInput['cableTypes']; circuits: BondingStudyInput['circuits'] }) {
  const placements = layout.circuits.flatMap((p) => {
    const circuit = circuits.find((c) => c.id === p.circuitId);
    const type = cableTypes.find((t) => t.id === circuit?.cableTypeId);
    const rM = (Number(type?.overallDiameterMm) || 100) / 2000;
    try {
      const cables = cablePositions({ centreXM: 0, ...p } as never).map((q, k) => ({ xM: Number(q.xM), depthM: Number(q.depthM), label: `${p.circuitId}-${'abc'[k]}` }));
      if (cables.some((c) => !Number.isFinite(c.xM) || !Number.isFinite(c.depthM))) return [];
      return [{ p, rM, cables }];
    } catch {
      return [];
    }
  });
  const eccs = (layout.eccs ?? []).map((e) => ({ xM: Number(e.xM), depthM: Number(e.depthM), label: e.eccId })).filter((e) => Number.isFinite(e.xM) && Number.isFinite(e.depthM));
  const xs = [...placements.flatMap((c) => c.cables.flatMap((q) => [q.xM - c.rM, q.xM + c.rM])), ...eccs.map((e) => e.xM), 0];
  const depths = [...placements.flatMap((c) => c.cables.map((q) => q.depthM + c.rM)), ...eccs.map((e) => e.depthM)];
  if (!placements.length && !eccs.length) return <p className="text-sm text-ink-soft">Place a circuit to see the sketch.</p>;
  const minX = Math.min(...xs);
  const maxX = Math.max(...xs);
  const maxDepth = Math.max(...depths, 0.1);
  const scale = Math.min((WIDTH_PX - 2 * MARGIN_PX) / Math.max(maxX - minX, 0.05), 260 / maxDepth);
  const px = (xM: number) => MARGIN_PX + (xM - minX) * scale;
  const py = (depthM: number) => MARGIN_PX + depthM * scale;
  const height = py(maxDepth) + MARGIN_PX;
  const marks = [
    ...placements.flatMap((c) => c.cables.map((q) => ({ x: px(q.xM), y: py(q.depthM), r: Math.max(c.rM * scale, 2), label: q.label }))),
    ...eccs.map((e) => ({ x: px(e.xM), y: py(e.depthM), r: 3, label: `ECC ${e.label}` })),
  ];
  // Where the dimension texts go, computed once: drawn below, and kept clear of the labels.
  const dims = placements.map(({ p, cables }) => {
    const deepest = Math.max(...cables.map((q) => q.depthM));
    const a = cables[0];
    const next = p.formation === 'flat' ? cables[1] : cables[2];
    const dimX = Math.min(...cables.map((q) => q.xM)) - 0.02;
    const depthText = `${fmt(deepest)} m`;
    const spacingText = p.formation === 'coordinates' ? '' : `s = ${fmt(Number(p.spacingM))} m`;
    return { p, deepest, a, next, dimX, depthText, spacingText, boxes: [
      { x: px(dimX) - 10 - depthText.length * 6, y: (py(0) + py(deepest)) / 2 - 10, width: depthText.length * 6, height: 12 },
      ...(p.formation !== 'coordinates' ? [{ x: (px(a.xM) + px(next.xM)) / 2 - spacingText.length * 3, y: py(deepest) + 15, width: spacingText.length * 6, height: 12 }] : []),
    ] };
  });
  const labels = placeLabels(marks, 6, 11, dims.flatMap((d) => d.boxes));

  return (
    <figure data-testid="cross-section-sketch">
      <svg width={WIDTH_PX} height={height} viewBox={`0 0 ${WIDTH_PX} ${height}`} role="img" aria-label={`Cross-section of layout ${layout.id}, to scale`} className="rounded border border-rule bg-white" fontSize={10} fontFamily="sans-serif">
        <line x1={0} x2={WIDTH_PX} y1={py(0)} y2={py(0)} stroke="#5a4a2a" strokeWidth={1.5} />
        {Array.from({ length: Math.ceil(WIDTH_PX / 8) }, (_, k) => <line key={k} x1={k * 8} x2={k * 8 - 6} y1={py(0)} y2={py(0) - 6} stroke="#8a7a5a" strokeWidth={0.7} />)}
        <text x={4} y={py(0) - 8} fill="#5a4a2a">ground</text>
        <line x1={px(0)} x2={px(0)} y1={py(0)} y2={height - 4} stroke="#999" strokeDasharray="3 3" />
        <text x={px(0) + 2} y={height - 6} fill="#666">x = 0</text>
        {dims.map(({ p, deepest, a, next, dimX, depthText, spacingText }) => (
          <g key={p.circuitId} stroke="#2a4a7a" fill="#2a4a7a" data-testid="dimension">
            <line x1={px(dimX) - 8} x2={px(dimX) - 8} y1={py(0)} y2={py(deepest)} strokeWidth={0.8} />
            <text x={px(dimX) - 10} y={(py(0) + py(deepest)) / 2} textAnchor="end" stroke="none">{depthText}</text>
            {p.formation !== 'coordinates' && <>
              <line x1={px(a.xM)} x2={px(next.xM)} y1={py(deepest) + 14} y2={py(deepest) + 14} strokeWidth={0.8} />
              <text x={(px(a.xM) + px(next.xM)) / 2} y={py(deepest) + 25} textAnchor="middle" stroke="none">{spacingText}</text>
              {Number(p.centreXM) !== 0 && <text x={px(Number(p.centreXM))} y={py(0) + 12} textAnchor="middle" stroke="none">offset {fmt(Number(p.centreXM))} m</text>}
            </>}
          </g>
        ))}
        {marks.map((m) => m.label.startsWith('ECC ')
          ? <circle key={m.label} cx={m.x} cy={m.y} r={m.r} fill="#2f6b3a" />
          : <circle key={m.label} cx={m.x} cy={m.y} r={m.r} fill="#a4522a" stroke="#16202e" />)}
        {labels.map((l) => (
          <g key={l.label}>
            {Math.hypot(l.x + l.width / 2 - l.markX, l.y + l.height / 2 - l.markY) > 30 && <line x1={l.markX} y1={l.markY} x2={l.x + l.width / 2} y2={l.y + l.height / 2} stroke="#999" strokeWidth={0.5} />}
            <text x={l.x} y={l.y + l.height - 2} fill="#16202e">{l.label}</text>
          </g>
        ))}
      </svg>
      <figcaption className="text-xs text-ink-soft">Drawn to scale ({fmt(100 / scale)} m per 100 px), ground surface at the top; depths to the deepest cable centre of each circuit.</figcaption>
    </figure>
  );
}
