/** Route sections to and from CSV (id, length in m, layout, cable transposition shift). */
export interface SectionRow {
  id: string;
  lengthM: number;
  layoutId: string;
  phaseRotation: 0 | 1 | 2;
}

export function sectionsToCsv(rows: SectionRow[]): string {
  return ['id,lengthM,layoutId,phaseRotation', ...rows.map((r) => `${r.id},${r.lengthM},${r.layoutId},${r.phaseRotation ?? 0}`)].join('\n') + '\n';
}

/**
 * Reads sections from CSV or from cells pasted from a spreadsheet (tab separated). A line may be
 * just a length; missing ids and layouts are filled in. Returns the rows, or the line that is wrong.
 */
export function parseSections(text: string, defaultLayoutId: string): { rows: SectionRow[] } | { error: string } {
  const lines = text.split(/\r?\n/).map((l) => l.trim()).filter(Boolean);
  const rows: SectionRow[] = [];
  for (const [i, line] of lines.entries()) {
    const cells = line.split(/[\t,;]/).map((c) => c.trim());
    if (i === 0 && /^id$/i.test(cells[0])) continue;
    const lengthCell = cells.length === 1 ? cells[0] : cells[1];
    const lengthM = Number(lengthCell);
    if (!Number.isFinite(lengthM) || lengthM <= 0) return { error: `Line ${i + 1}: "${lengthCell}" is not a length in metres above zero.` };
    const rotation = Number(cells[3] ?? 0);
    if (![0, 1, 2].includes(rotation)) return { error: `Line ${i + 1}: the transposition shift must be 0, 1 or 2.` };
    rows.push({ id: cells.length > 1 && cells[0] ? cells[0] : `S${rows.length + 1}`, lengthM, layoutId: cells[2] || defaultLayoutId, phaseRotation: rotation as 0 | 1 | 2 });
  }
  return rows.length ? { rows } : { error: 'Nothing to read: give one section per line.' };
}
