import Papa from 'papaparse';

/**
 * CSV written for spreadsheets: RFC 4180 quoting, CRLF line ends, and text cells that start
 * with = + - @ (or a tab or carriage return) prefixed with an apostrophe, so that a spreadsheet
 * shows them instead of running them as formulas. Numbers stay numbers.
 */
export function toCsv(columns: readonly string[], rows: readonly (readonly unknown[])[]): string {
  const cells = rows.map((row) => row.map((v) => (v !== null && typeof v === 'object' && !(v instanceof Date) ? JSON.stringify(v) : v)));
  return Papa.unparse({ fields: [...columns], data: cells }, { newline: '\r\n', escapeFormulae: true }) + '\r\n';
}

/** A parsed CSV: header names as written (trimmed, lower case) and each data row keyed by them, with its line number. */
export interface ParsedCsv {
  header: string[];
  rows: { line: number; cells: Record<string, string> }[];
  /** Structural faults (unclosed quotes, too many cells), each naming its line. */
  errors: string[];
  delimiter: string;
}

/**
 * Reads CSV text with a header row. The delimiter is detected among comma, semicolon and tab, so
 * a sheet exported with decimal commas (semicolon-separated) reads as written.
 */
export function parseCsv(text: string): ParsedCsv {
  const result = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy', delimitersToGuess: [',', ';', '\t'] });
  const [head = [], ...body] = result.data;
  const header = head.map((h) => h.trim().toLowerCase());
  const errors = result.errors.map((e) => `Line ${(e.row ?? 0) + 1}: ${e.message}.`);
  const rows = body.map((cells, i) => ({
    line: i + 2,
    cells: Object.fromEntries(header.map((h, c) => [h, (cells[c] ?? '').trim()])),
  }));
  return { header, rows, errors, delimiter: result.meta.delimiter };
}

/**
 * A number as a person types it in a cell: "480.5", or "480,5" where the file is not
 * comma-separated (a semicolon or tab sheet from a decimal-comma locale). Anything else,
 * including thousands separators, is not a number (NaN), never a guess.
 */
export function cellNumber(text: string, delimiter: string): number {
  const t = text.trim();
  if (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) return Number(t);
  if (delimiter !== ',' && /^[+-]?\d+,\d+$/.test(t)) return Number(t.replace(',', '.'));
  return Number.NaN;
}
