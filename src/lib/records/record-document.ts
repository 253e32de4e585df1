import { AlignmentType, Document, Footer, Header, ImageRun, Packer, PageNumber, Paragraph, type Table, TextRun } from 'docx';
import type { BondingResults } from '../calc';
import { formatQuantity } from '../format';
import { fill, recordTemplate } from './record-template';
import type { RecordData } from './record-data';
import { body, heading, subheading } from './record-paragraphs';
import { textTable } from './record-tables';
import { inputBlocks } from './record-inputs';
import { resultBlocks } from './record-results';
import { routePlotSvg, svgToPng } from './route-plot';

const date = (d: Date | string | null | undefined) => (d ? new Date(d).toISOString().slice(0, 10) : '—');
const ROLE_WORD = { designer: 'Designed', checker: 'Checked', approver: 'Approved' } as const;

/** Renders a revision's calculation record as a Word document. */
export async function renderRecord(data: RecordData): Promise<Buffer> {
  const { text, layout } = recordTemplate();
  const marking = data.draft ? text.draftMarking : text.issuedMarking;
  const run = (t: string, extra: Record<string, unknown> = {}) => new TextRun({ text: t, font: layout.font, size: layout.smallSize, ...extra });

  const children: Array<Paragraph | Table> = [
    new Paragraph({ children: [new TextRun({ text: text.documentTitle, bold: true, size: layout.titleSize, font: layout.font, color: layout.headingColour })] }),
    new Paragraph({ spacing: { after: 200 }, children: [new TextRun({ text: `${data.study.code} ${data.study.title}`, size: 28, font: layout.font })] }),
    textTable(
      ['field', 'value'],
      [
        ['project', `${data.project.code} ${data.project.name}`],
        ['study', `${data.study.code} ${data.study.title} (${data.study.kind})`],
        ['revision', `${data.revision.number}`],
        ['status', data.revision.state.replace(/_/g, ' ')],
        ['created', date(data.revision.createdAt)],
        ['issued', date(data.revision.issuedAt)],
        ['engine version', data.revision.engineVersion ?? 'not calculated'],
        ['inputs hash (SHA-256)', data.revision.inputsHash],
        ['limit set', data.limitSet ? `${data.limitSet.name}, version ${data.limitSet.version}` : '—'],
      ],
    ),
    heading(text.scopeHeading),
    body(text.scope),
    heading(text.methodHeading),
    ...text.method.map((m) => body(m)),
    heading(text.inputsHeading),
    ...inputBlocks(data.inputs),
    heading(text.resultsHeading),
    ...(data.results ? resultBlocks(data.results) : [body('The revision has not been calculated.', { italic: true })]),
    ...plotBlocks(data),
    heading(text.checklistHeading),
    textTable(
      ['item', 'case', 'value', 'limit', 'margin', 'verdict', 'source / basis'],
      data.checklist.map((i) =>
        i.kind === 'computed'
          ? [`${i.title} (${i.location ?? ''})`, i.caseId ?? '', i.value === null ? '—' : formatQuantity(i.value, i.unit), i.limitValue === null ? '—' : formatQuantity(i.limitValue, i.unit), i.marginPct === null ? '—' : `${i.marginPct.toFixed(1)} %`, verdict(i.status, i.justification), i.source]
          : [i.title, '', i.answer ?? 'not answered', '', '', `${i.answer ?? 'OPEN'}${i.answerReason ? `: ${i.answerReason}` : ''}${i.justification ? `; justified: ${i.justification}` : ''}`, i.source],
      ),
    ),
    heading(text.remarksHeading),
    data.remarks.length
      ? textTable(['date', 'by', 'about', 'remark', 'resolved'], data.remarks.map((r) => [date(r.createdAt), r.authorName, r.itemKey ?? r.field ?? 'general', r.body, r.resolved ? 'yes' : 'no']))
      : body(text.noRemarks, { italic: true }),
    heading(text.checkValuesHeading),
    data.checkValues.length
      ? textTable(['item', "checker's value", 'computed', 'deviation', 'tolerance', 'explanation'], data.checkValues.map((v) => [v.itemKey, formatQuantity(v.checkerValue), formatQuantity(v.computedValue), `${v.deviationPct.toFixed(2)} %`, `${v.tolerancePct} %`, v.explanation ?? '—']))
      : body(text.noCheckValues, { italic: true }),
    heading(text.signOffHeading),
    textTable(
      ['', 'name', 'date', 'statement'],
      (['designer', 'checker', 'approver'] as const).map((role) => {
        const s = [...data.signOffs].reverse().find((x) => x.role === role);
        return [ROLE_WORD[role], s?.name ?? text.notSigned, date(s?.createdAt), s?.statement ?? '—'];
      }),
    ),
    heading(text.cautionHeading),
    body(text.caution),
  ];

  const doc = new Document({
    creator: 'Sheathwise',
    title: `${data.study.code} rev ${data.revision.number}`,
    styles: { default: { document: { run: { font: layout.font, size: layout.bodySize } } } },
    sections: [
      {
        properties: { page: { margin: { top: layout.pageMargin, bottom: layout.pageMargin, left: layout.pageMargin, right: layout.pageMargin } } },
        headers: {
          default: new Header({
            children: [new Paragraph({ alignment: AlignmentType.RIGHT, children: [run(marking, { bold: data.draft, color: data.draft ? layout.draftColour : undefined })] })],
          }),
        },
        footers: {
          default: new Footer({
            children: [
              new Paragraph({
                alignment: AlignmentType.CENTER,
                children: [run(`${fill(text.footer, { study: data.study.code, revision: data.revision.number })}, page `), new TextRun({ children: [PageNumber.CURRENT], font: layout.font, size: layout.smallSize }), run(' of '), new TextRun({ children: [PageNumber.TOTAL_PAGES], font: layout.font, size: layout.smallSize })],
              }),
            ],
          }),
        },
        children,
      },
    ],
  });
  return Packer.toBuffer(doc);
}

function verdict(status: string, justification: string | null): string {
  const word = status === 'pass' ? 'PASS' : status === 'fail' ? 'FAIL' : 'NO LIMIT';
  return justification ? `${word} (justified: ${justification})` : word;
}

/** The along-route plot of the first normal-load case of a bonding study. */
function plotBlocks(data: RecordData): Paragraph[] {
  if (!data.results || data.results.kind !== 'bonding') return [];
  const results = data.results as BondingResults;
  const c = results.cases.find((x) => x.kind === 'normal') ?? results.cases[0];
  if (!c) return [];
  const { text, layout } = recordTemplate();
  const limit = data.checklist.find((i) => i.itemKey === `standing-voltage-normal:${c.caseId}`)?.limitValue ?? null;
  const png = svgToPng(routePlotSvg(c, limit, layout.plot.widthPx, layout.plot.heightPx));
  return [
    subheading(text.plotHeading),
    new Paragraph({ children: [new ImageRun({ type: 'png', data: png, transformation: { width: layout.plot.widthEmuPt, height: layout.plot.heightEmuPt } })] }),
    body(fill(text.plotCaption, { case: `${c.caseId} (${c.name})`, limit: limit === null ? 'no limit set' : `${formatQuantity(limit, 'V')}` }), { italic: true }),
  ];
}
