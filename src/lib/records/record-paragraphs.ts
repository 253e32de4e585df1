import { HeadingLevel, Paragraph, TextRun } from 'docx';
import { recordTemplate } from './record-template';

export function heading(text: string): Paragraph {
  const { layout } = recordTemplate();
  return new Paragraph({ heading: HeadingLevel.HEADING_1, spacing: { before: 280, after: 120 }, children: [new TextRun({ text, bold: true, size: 28, color: layout.headingColour, font: layout.font })] });
}

export function subheading(text: string): Paragraph {
  const { layout } = recordTemplate();
  return new Paragraph({ heading: HeadingLevel.HEADING_2, spacing: { before: 200, after: 80 }, children: [new TextRun({ text, bold: true, size: 22, font: layout.font })] });
}

export function body(text: string, options: { italic?: boolean; colour?: string } = {}): Paragraph {
  const { layout } = recordTemplate();
  return new Paragraph({ spacing: { after: 100 }, children: [new TextRun({ text, size: layout.bodySize, font: layout.font, italics: options.italic, color: options.colour })] });
}
