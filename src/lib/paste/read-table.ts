import Papa from 'papaparse';

/** One record of pasted or imported text: its line number (from 1) and its trimmed cells. */
export interface TableRecord {
  line: number;
  cells: string[];
}

export type Delimiter = '\t' | ';' | ',';

/**
 * The delimiter a spreadsheet would have used: tab (cells copied from a sheet), else semicolon
 * (CSV saved where the comma is the decimal sign), else comma. Only a tab or semicolon lets an
 * unquoted decimal comma stand in a cell.
 */
export function chooseDelimiter(text: string): Delimiter {
  if (text.includes('\t')) return '\t';
  if (text.includes(';')) return ';';
  return ',';
}

/** Splits text into records with papaparse (quotes honoured); blank lines are left out. */
export function readTable(text: string): { delimiter: Delimiter; records: TableRecord[] } {
  const delimiter = chooseDelimiter(text);
  const parsed = Papa.parse<string[]>(text.replace(/^\ufeff/, ''), { delimiter, skipEmptyLines: false });
  const records: TableRecord[] = [];
  parsed.data.forEach((cells, i) => {
    const trimmed = cells.map((c) => c.trim());
    if (trimmed.every((c) => c === '')) return;
    records.push({ line: i + 1, cells: trimmed });
  });
  return { delimiter, records };
}

export function delimiterName(d: Delimiter): string {
  return d === '\t' ? 'tabs' : d === ';' ? 'semicolons' : 'commas';
}
