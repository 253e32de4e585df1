// Where the sketch puts its labels: each beside its own mark, on the first side where it
// overlaps neither another label nor any mark. Pure geometry in drawing units (px).

export interface Mark {
  x: number;
  y: number;
  r: number;
  label: string;
}
export interface PlacedLabel {
  label: string;
  x: number;
  y: number;
  width: number;
  height: number;
  /** The mark it belongs to, for a leader line when it had to move away. */
  markX: number;
  markY: number;
}

const overlaps = (a: { x: number; y: number; width: number; height: number }, b: { x: number; y: number; width: number; height: number }) =>
  a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

export type Box = { x: number; y: number; width: number; height: number };

/**
 * Boxes (top-left corner) of the labels; `charWidth` and `height` estimate the text size. `keepClear`
 * are other things already drawn (dimension texts) that labels must not cover either.
 */
export function placeLabels(marks: Mark[], charWidth = 6, height = 11, keepClear: Box[] = []): PlacedLabel[] {
  const placed: PlacedLabel[] = [];
  const obstacles = [...marks.map((m) => ({ x: m.x - m.r, y: m.y - m.r, width: 2 * m.r, height: 2 * m.r })), ...keepClear];
  for (const m of marks) {
    const width = m.label.length * charWidth;
    const gap = 2;
    const candidates: Array<[number, number]> = [];
    // Above, below, right, left; then further out in the same directions.
    for (let ring = 0; ring < 6; ring++) {
      const d = m.r + gap + ring * height;
      candidates.push([m.x - width / 2, m.y - d - height], [m.x - width / 2, m.y + d], [m.x + d, m.y - height / 2], [m.x - d - width, m.y - height / 2]);
    }
    let choice = candidates[0];
    for (const c of candidates) {
      const box = { x: c[0], y: c[1], width, height };
      if (!placed.some((p) => overlaps(p, box)) && !obstacles.some((o) => overlaps(o, box))) {
        choice = c;
        break;
      }
    }
    placed.push({ label: m.label, x: choice[0], y: choice[1], width, height, markX: m.x, markY: m.y });
  }
  return placed;
}

export { overlaps };
