import { delimiterName, readTable, type Delimiter } from './read-table';
import { readNumber } from './read-number';

/** A route section as pasted: id, length in m, layout, cable shift at its start (0, 1, 2). */
export interface PastedSection {
  id: string;
  lengthM: number;
  layoutId: string;
  phaseRotation: 0 | 1 | 2;
}

/** One row of the preview: the cells as read, the section made of them, or why not. */
export interface PreviewRow {
  line: number;
  cells: string[];
  section?: PastedSection;
  errors: string[];
}

export interface SectionsPreview {
  delimiter: Delimiter;
  header: boolean;
  columns: Column[];
  rows: PreviewRow[];
  /** Problems with the paste as a whole (nothing to read, unknown header). */
  problems: string[];
  /** True when every row was read and there is at least one: only then may it be applied. */
  ok: boolean;
}

type Column = 'id' | 'lengthM' | 'layoutId' | 'phaseRotation';

const HEADER_NAMES: Record<string, Column> = {
  id: 'id', section: 'id', 'section id': 'id',
  length: 'lengthM', lengthm: 'lengthM', 'length (m)': 'lengthM', 'length m': 'lengthM',
  layout: 'layoutId', layoutid: 'layoutId',
  shift: 'phaseRotation', phaserotation: 'phaseRotation', transposition: 'phaseRotation', 'cables shifted at start': 'phaseRotation',
};
const POSITIONAL: Record<number, Column[]> = {
  1: ['lengthM'],
  2: ['id', 'lengthM'],
  3: ['id', 'lengthM', 'layoutId'],
  4: ['id', 'lengthM', 'layoutId', 'phaseRotation'],
};
const COLUMN_WORDS: Record<Column, string> = { id: 'id', lengthM: 'length (m)', layoutId: 'layout', phaseRotation: 'cables shifted at start' };

const isHeader = (cells: string[]) => cells.some((c) => HEADER_NAMES[c.toLowerCase()] !== undefined) && cells.every((c) => c === '' || 'error' in readNumber(c));

/**
 * Reads route sections pasted from a spreadsheet or imported from CSV, row by row, for a preview
 * before anything is applied. Without a header the columns go by count: length; id, length; id,
 * length, layout; id, length, layout, shift. Every row names its own problems.
 */
export function previewSections(text: string, opts: { defaultLayoutId: string; layoutIds: string[] }): SectionsPreview {
  const { delimiter, records } = readTable(text);
  const problems: string[] = [];
  if (records.length === 0) return { delimiter, header: false, columns: [], rows: [], problems: ['Nothing to read: give one section per line.'], ok: false };

  let columns: Column[];
  let body = records;
  const header = isHeader(records[0].cells);
  if (header) {
    columns = [];
    for (const name of records[0].cells) {
      const col = HEADER_NAMES[name.toLowerCase()];
      if (!col) problems.push(`Column “${name}” is not one this table knows: use id, length, layout and shift.`);
      else columns.push(col);
    }
    if (!columns.includes('lengthM')) problems.push('The header has no length column.');
    body = records.slice(1);
  } else {
    // The count most rows have (the smaller on a tie): one odd row, e.g. a split decimal comma, is refused, not followed.
    const counts = new Map<number, number>();
    for (const r of records) counts.set(r.cells.length, (counts.get(r.cells.length) ?? 0) + 1);
    const usual = [...counts].sort((a, b) => b[1] - a[1] || a[0] - b[0])[0][0];
    columns = POSITIONAL[usual] ?? [];
    if (!columns.length) problems.push(`Most lines have ${usual} cells; a row has 1 to 4 (id, length, layout, shift).`);
  }

  const seen = new Map<string, number>();
  const rows = body.map((rec, index): PreviewRow => {
    const errors: string[] = [];
    if (columns.length && rec.cells.length !== columns.length) {
      errors.push(
        `Line ${rec.line} has ${rec.cells.length} cells where the table has ${columns.length} (${columns.map((c) => COLUMN_WORDS[c]).join(', ')}).` +
          (delimiter === ',' ? ' If a number has a decimal comma, quote it ("480,5"), use a decimal point, or separate the columns with tabs or semicolons.' : ''),
      );
      return { line: rec.line, cells: rec.cells, errors };
    }
    const cell = (c: Column) => rec.cells[columns.indexOf(c)];
    if (delimiter === ',' && !header && columns.length === 2 && /^\d+$/.test(rec.cells[0]) && /^\d+$/.test(rec.cells[1]))
      errors.push(`Line ${rec.line}: “${rec.cells.join(',')}” could be one length with a decimal comma or an id and a length. Use a decimal point, quote the number, or separate the columns with tabs or semicolons.`);

    const after = rec.cells[columns.indexOf('lengthM') + 1];
    if (delimiter === ',' && !header && /^\d+$/.test(cell('lengthM') ?? '') && after !== undefined && /^\d+$/.test(after))
      errors.push(`Line ${rec.line}: “${cell('lengthM')},${after}” could be one length with a decimal comma. Use a decimal point, quote the number, or separate the columns with tabs or semicolons.`);
    const length = readNumber(cell('lengthM') ?? '');
    let lengthM = NaN;
    if ('empty' in length) errors.push(`Line ${rec.line}: the length is missing.`);
    else if ('error' in length) errors.push(`Line ${rec.line}, length: ${length.error}`);
    else if (!(length.value > 0)) errors.push(`Line ${rec.line}: the length must be above zero metres.`);
    else lengthM = length.value;

    const id = (columns.includes('id') && cell('id')) || `S${index + 1}`;
    if (seen.has(id)) errors.push(`Line ${rec.line}: section id ${id} is also on line ${seen.get(id)}.`);
    else seen.set(id, rec.line);

    const layoutId = (columns.includes('layoutId') && cell('layoutId')) || opts.defaultLayoutId;
    if (!opts.layoutIds.includes(layoutId)) errors.push(`Line ${rec.line}: there is no layout ${layoutId} (the study has ${opts.layoutIds.join(', ') || 'none'}).`);

    let phaseRotation: 0 | 1 | 2 = 0;
    const shiftCell = columns.includes('phaseRotation') ? cell('phaseRotation') : '';
    if (shiftCell) {
      const shift = readNumber(shiftCell);
      if ('value' in shift && [0, 1, 2].includes(shift.value)) phaseRotation = shift.value as 0 | 1 | 2;
      else errors.push(`Line ${rec.line}: the cable shift must be 0, 1 or 2, not “${shiftCell}”.`);
    }
    return errors.length ? { line: rec.line, cells: rec.cells, errors } : { line: rec.line, cells: rec.cells, errors, section: { id, lengthM, layoutId, phaseRotation } };
  });
  if (header && rows.length === 0) problems.push('Only a header: give one section per line below it.');
  return { delimiter, header, columns, rows, problems, ok: problems.length === 0 && rows.length > 0 && rows.every((r) => r.section) };
}

export function describeDelimiter(p: SectionsPreview): string {
  return `Columns separated by ${delimiterName(p.delimiter)}${p.header ? ', with a header row' : ''}.`;
}
