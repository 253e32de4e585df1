import { BorderStyle, Paragraph, ShadingType, Table, TableCell, TableRow, TextRun, WidthType } from 'docx';
import { recordTemplate } from './record-template';

/** A full-width table with a shaded header row; every cell is plain text. */
export function textTable(header: string[], rows: Array<Array<string | number>>): Table {
  const { layout } = recordTemplate();
  const cell = (text: string, head = false) =>
    new TableCell({
      shading: head ? { type: ShadingType.CLEAR, fill: layout.tableHeaderShading, color: 'auto' } : undefined,
      margins: { top: 40, bottom: 40, left: 80, right: 80 },
      children: [new Paragraph({ children: [new TextRun({ text, bold: head, size: layout.smallSize, font: layout.font })] })],
    });
  const border = { style: BorderStyle.SINGLE, size: 4, color: 'D9D4C8' };
  return new Table({
    width: { size: 100, type: WidthType.PERCENTAGE },
    borders: { top: border, bottom: border, left: border, right: border, insideHorizontal: border, insideVertical: border },
    rows: [
      new TableRow({ tableHeader: true, children: header.map((h) => cell(h, true)) }),
      ...rows.map((r) => new TableRow({ children: r.map((v) => cell(String(v))) })),
    ],
  });
}
