import { describe, expect, it } from 'vitest';
import { cellNumber, parseCsv, toCsv } from '../../../src/lib/csv/csv-text';
import { parseMeasurements } from '../../../src/lib/files/measurements';

// CSV as spreadsheets read it (RFC 4180) and as people type numbers in it.

describe('toCsv', () => {
  it('quotes commas, quotes and line breaks, ends lines with CRLF, and keeps numbers as numbers', () => {
    const text = toCsv(['a', 'b', 'c'], [['x, y', 'say "hi"', 'two\nlines'], [-5, 1.25, null]]);
    expect(text).toBe('a,b,c\r\n"x, y","say ""hi""","two\nlines"\r\n-5,1.25,\r\n');
  });

  it('defuses text cells a spreadsheet would run as a formula (OWASP CSV injection)', () => {
    const text = toCsv(['name'], [['=HYPERLINK("http://x")'], ['+1'], ['-2+3'], ['@SUM(A1)'], ['plain']]);
    const cells = parseCsv(text).rows.map((r) => r.cells.name);
    expect(cells).toEqual(["'=HYPERLINK(\"http://x\")", "'+1", "'-2+3", "'@SUM(A1)", 'plain']);
  });

  it('writes objects as JSON text', () => {
    expect(toCsv(['d'], [[{ k: 1 }]])).toBe('d\r\n"{""k"":1}"\r\n');
  });
});

describe('parseCsv and cellNumber', () => {
  // Each row: text as typed, the delimiter of its file, the number read (NaN: refused, never guessed).
  const table: [string, string, number][] = [
    ['480.5', ',', 480.5],
    ['480,5', ';', 480.5],
    ['480,5', '\t', 480.5],
    ['-12', ',', -12],
    ['1e3', ',', 1000],
    ['1,234.5', ';', Number.NaN],
    ['1.234,5', ';', Number.NaN],
    ['12 V', ',', Number.NaN],
    ['', ',', Number.NaN],
  ];
  it.each(table)('%j in a %j file reads as %d', (text, delimiter, expected) => {
    expect(cellNumber(text, delimiter)).toEqual(expected);
  });

  it('detects a semicolon sheet, so a decimal comma stays inside its cell', () => {
    const csv = parseCsv('joint;cable;measured_v;load_a\r\n1;C1-a;12,5;480,5\r\n');
    expect(csv.delimiter).toBe(';');
    expect(csv.rows).toEqual([{ line: 2, cells: { joint: '1', cable: 'C1-a', measured_v: '12,5', load_a: '480,5' } }]);
  });

  it('reads commissioning readings from either kind of sheet, and names the line of each bad row', () => {
    expect(parseMeasurements('\uFEFFjoint;cable;measured_v;load_a\n1;C1-a;12,5;480,5\n')).toEqual({ rows: [{ jointIndex: 1, cable: 'C1-a', measuredV: 12.5, loadCurrentA: 480.5 }] });
    expect(parseMeasurements('load_a,joint,cable,measured_v\n480.5,2,C1-b,9\n')).toEqual({ rows: [{ jointIndex: 2, cable: 'C1-b', measuredV: 9, loadCurrentA: 480.5 }] });
    expect(parseMeasurements('joint,cable,measured_v,load_a\n1,C1-a,12,480\n1,C1-a,"12,5",480\n')).toEqual({ errors: ['Line 3: measured_v must be a voltage of zero or more.'] });
    expect(parseMeasurements('joint,cable,volts\n1,C1-a,3\n')).toEqual({ errors: ['The header row lacks measured_v, load_a: expected joint, cable, measured_v, load_a.'] });
  });
});
