import { describe, expect, it } from 'vitest';
import { overlaps, placeLabels, type Mark } from '../../../src/components/editor/sketch-layout';

describe('sketch labels', () => {
  it('places every label clear of the other labels and of every cable, even in a touching trefoil pair', () => {
    // Two touching trefoils 0.3 m apart and an ECC between them, drawn at 300 px/m.
    const s = 300;
    const r = 0.0525 * s;
    const trefoil = (cx: number, id: string): Mark[] => [
      { x: (cx - 0.0525) * s, y: 1.2 * s, r, label: `${id}-a` },
      { x: cx * s, y: (1.2 - 0.105 * Math.sqrt(3) / 2) * s, r, label: `${id}-b` },
      { x: (cx + 0.0525) * s, y: 1.2 * s, r, label: `${id}-c` },
    ];
    const marks = [...trefoil(0, 'C1'), ...trefoil(0.3, 'C2'), { x: 0.15 * s, y: 1.0 * s, r: 3, label: 'E1' }];
    const labels = placeLabels(marks);
    expect(labels).toHaveLength(marks.length);
    for (const [i, a] of labels.entries()) {
      for (const b of labels.slice(i + 1)) expect(overlaps(a, b), `${a.label} on ${b.label}`).toBe(false);
      for (const m of marks) expect(overlaps(a, { x: m.x - m.r, y: m.y - m.r, width: 2 * m.r, height: 2 * m.r }), `${a.label} on ${m.label}`).toBe(false);
    }
  });
});
