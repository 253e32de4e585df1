import type { Layout } from '../../schemas/bonding-study.schema';

type Placement = Layout['circuits'][number];

const SQRT3_2 = Math.sqrt(3) / 2;

/**
 * Centres of the cables carrying phases a, b, c, in metres (x across the route, depth below
 * ground). Trefoil: a and c side by side at the given depth, b above them; flat: a, b, c
 * left to right with b at the centre.
 */
export function cablePositions(p: Placement): Array<{ xM: number; depthM: number }> {
  if (p.formation === 'coordinates') return p.positions;
  const s = p.spacingM;
  if (p.formation === 'trefoil') {
    return [
      { xM: p.centreXM - s / 2, depthM: p.depthM },
      { xM: p.centreXM, depthM: p.depthM - s * SQRT3_2 },
      { xM: p.centreXM + s / 2, depthM: p.depthM },
    ];
  }
  return [
    { xM: p.centreXM - s, depthM: p.depthM },
    { xM: p.centreXM, depthM: p.depthM },
    { xM: p.centreXM + s, depthM: p.depthM },
  ];
}

/** Where the cable of phase φ lies once the cables have shifted `rotation` positions. */
export const positionOfPhase = (phase: number, rotation: number): number => (phase + rotation) % 3;
