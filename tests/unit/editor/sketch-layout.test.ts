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

describe('sketch labels and dimension texts', () => {
  it('keeps labels off the boxes it is told to keep clear', () => {
    const marks: Mark[] = [{ x: 100, y: 100, r: 10, label: 'C1-a' }];
    const dimension = { x: 70, y: 70, width: 60, height: 20 }; // covers the place above the cable
    const [label] = placeLabels(marks, 6, 11, [dimension]);
    expect(overlaps(label, dimension)).toBe(false);
    expect(overlaps(label, { x: 90, y: 90, width: 20, height: 20 })).toBe(false);
  });
});
