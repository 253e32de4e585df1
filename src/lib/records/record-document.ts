import { AlignmentType, Document, Footer, Header, ImageRun, Packer, PageNumber, Paragraph, type Table, TextRun } from 'docx';
import type { BondingResults, CaseResult } from '../calc/bonding/results';
import { formatIsoDate as date, formatMarginPct, formatQuantity } from '../format';
import { STATE_LABEL } from '../../components/ui/states';
import { criterionLabel, itemLabel, verdictLabel } from '../compare/labels';
import { fill, recordTemplate } from './record-template';
import type { RecordData } from './record-data';
import { body, heading, subheading } from './record-paragraphs';
import { textTable } from './record-tables';
import { inputBlocks } from './record-inputs';
import { resultBlocks } from './record-results';
import { routePlotSvg, svgToPng } from './route-plot';
import { assumptions } from './record-assumptions';
import { eventSentence } from './event-sentences';
import { validationBlocks } from './record-validation';
import { criterionSection } from '../methods/method-reference';
import { explorationBlocks } from './record-explorations';

const ROLE_WORD = { designer: 'Designed', checker: 'Checked', approver: 'Approved' } as const;

/** Renders a revision's calculation record as a Word document. */
export async function renderRecord(data: RecordData): Promise<Buffer> {
  const { text, layout } = recordTemplate();
  const marking = data.draft ? text.draftMarking : text.issuedMarking;
  const run = (t: string, extra: Record<string, unknown> = {}) => new TextRun({ text: t, font: layout.font, size: layout.smallSize, ...extra });
  const computed = data.checklist.filter((i) => i.kind === 'computed');
  const manual = data.checklist.filter((i) => i.kind === 'manual');

  const children: Array<Paragraph | Table> = [
    new Paragraph({ children: [new TextRun({ text: text.documentTitle, bold: true, size: layout.titleSize, font: layout.font, color: layout.headingColour })] }),
    new Paragraph({ spacing: { after: 200 }, children: [new TextRun({ text: `${data.study.code} ${data.study.title}`, size: 28, font: layout.font })] }),
    textTable(
      ['field', 'value'],
      [
        ['document number', data.documentNumber],
        ['project', `${data.project.code} ${data.project.name}`],
        ['study', `${data.study.code} ${data.study.title} (${data.study.kind === 'bonding' ? 'sheath bonding study' : 'metalwork exposure study'})`],
        ['revision', `${data.revision.number}`],
        ['status', STATE_LABEL[data.revision.state] ?? data.revision.state],
        ['created', date(data.revision.createdAt)],
        ['issued', date(data.revision.issuedAt)],
        ['engine version', data.revision.engineVersion ?? 'not calculated'],
        ['inputs hash (SHA-256)', data.revision.inputsHash],
        ['limit set', data.limitSet ? `${data.limitSet.name}, version ${data.limitSet.version}` : '—'],
      ],
    ),
    heading(text.historyHeading),
    textTable(
      ['revision', 'state', 'created', 'issued', 'designer', 'checker', 'approver'],
      data.history.map((h) => [h.number, STATE_LABEL[h.state] ?? h.state, date(h.createdAt), date(h.issuedAt), h.designer || '—', h.checker || '—', h.approver || '—']),
    ),
    ...(data.workflowEvents.length
      ? [subheading(text.stepsHeading), textTable(['date', 'revision', 'step', 'reason'], data.workflowEvents.map((e) => [date(e.at), e.revision, eventSentence({ type: e.type, actorName: e.actor, revisionNumber: e.revision, detail: {} }), e.reason ?? '—']))]
      : []),
    ...changeBlocks(data),
    heading(text.scopeHeading),
    body(text.scope),
    heading(text.methodHeading),
    ...text.method.map((m) => body(m)),
    ...validationBlocks(data.validation),
    heading(text.assumptionsHeading),
    ...assumptions(data.inputs).map((a) => body(`• ${a}`)),
    heading(text.inputsHeading),
    ...inputBlocks(data.inputs),
    heading(text.limitsHeading),
    ...limitBlocks(data),
    heading(text.resultsHeading),
    ...(data.results ? resultBlocks(data.results, data.inputs.kind === 'bonding' ? data.inputs : {}) : [body('The revision has not been calculated.', { italic: true })]),
    ...plotBlocks(data),
    ...explorationBlocks(data.explorations),
    heading(text.checklistHeading),
    ...(computed.length
      ? [
          textTable(
            ['check', 'case', 'where', 'value', 'limit', 'margin', 'verdict', 'source of the limit', 'method section'],
            computed.map((i) => [i.title, i.caseId ?? '—', i.location ?? '—', i.value === null ? '—' : formatQuantity(i.value, i.unit), i.limitValue === null ? '—' : formatQuantity(i.limitValue, i.unit), i.marginPct === null ? '—' : formatMarginPct(i.marginPct), verdict(i.status, i.justification), i.source, criterionSection(i.itemKey) ?? '—']),
          ),
        ]
      : [body('No computed checks.', { italic: true })]),
    ...(manual.length ? [subheading(text.manualHeading), manualTable(manual)] : []),
    heading(text.remarksHeading),
    ...remarkBlocks(data),
    heading(text.checkValuesHeading),
    data.checkValues.length
      ? textTable(
          ['result checked', "checker's value", 'computed', 'deviation', 'tolerance', 'explanation'],
          data.checkValues.map((v) => {
            const item = data.checklist.find((i) => i.itemKey === v.itemKey);
            return [itemLabel(item, v.itemKey), formatQuantity(v.checkerValue, item?.unit ?? ''), formatQuantity(v.computedValue, item?.unit ?? ''), `${Number(v.deviationPct.toPrecision(2))} %`, `${v.tolerancePct} %`, v.explanation ?? '—'];
          }),
        )
      : body(text.noCheckValues, { italic: true }),
    heading(text.filesHeading),
    data.files.length
      ? textTable(['file', 'kind', 'size', 'attached', 'by', 'SHA-256'], data.files.map((f) => [f.fileName, f.kind.replace(/-/g, ' '), `${f.sizeBytes} bytes`, date(f.createdAt), f.uploadedBy, f.sha256]))
      : body(text.noFiles, { italic: true }),
    ...commissioningBlocks(data),
    heading(text.signOffHeading),
    textTable(
      ['', 'name', 'date', 'statement', 'signed inputs / results (SHA-256)'],
      (['designer', 'checker', 'approver'] as const).map((role) => {
        const s = [...data.signOffs].reverse().find((x) => x.role === role);
        const hashes = s ? [s.inputsHash, s.resultsHash].filter((h): h is string => typeof h === 'string').join(' / ') : '';
        const standing = s && !s.valid ? ` (${s.voidReason})` : '';
        return [ROLE_WORD[role], s?.name ?? text.notSigned, date(s?.createdAt), s?.statement ?? '—', (hashes || '—') + standing];
      }),
    ),
    heading(text.cautionHeading),
    body(text.caution),
  ];

  const doc = new Document({
    title: `${data.documentNumber} ${data.study.code} ${data.study.title}`,
    subject: `${text.documentTitle}, ${data.project.code} ${data.project.name}, study ${data.study.code} revision ${data.revision.number}`,
    creator: data.designerName || 'Sheathwise',
    lastModifiedBy: 'Sheathwise',
    keywords: data.documentNumber,
    revision: data.revision.number,
    customProperties: [
      { name: 'Document number', value: data.documentNumber },
      { name: 'Inputs hash', value: data.revision.inputsHash },
    ],
    styles: { default: { document: { run: { font: layout.font, size: layout.bodySize } } } },
    sections: [
      {
        properties: { page: { margin: { top: layout.pageMargin, bottom: layout.pageMargin, left: layout.pageMargin, right: layout.pageMargin } } },
        headers: {
          default: new Header({
            children: [new Paragraph({ alignment: AlignmentType.RIGHT, children: [run(`${data.documentNumber}    `), run(marking, { bold: data.draft, color: data.draft ? layout.draftColour : undefined })] })],
          }),
        },
        footers: {
          default: new Footer({
            children: [
              new Paragraph({
                alignment: AlignmentType.CENTER,
                children: [run(`${fill(text.footer, { document: data.documentNumber, study: data.study.code, revision: data.revision.number })}, page `), new TextRun({ children: [PageNumber.CURRENT], font: layout.font, size: layout.smallSize }), run(' of '), new TextRun({ children: [PageNumber.TOTAL_PAGES], font: layout.font, size: layout.smallSize })],
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
  const word = verdictLabel(status);
  return justification ? `${word} (justified: ${justification})` : word;
}

/** Manual questions: only the columns that carry something, the answer once. */
function manualTable(items: RecordData['checklist']): Table {
  const hasReason = items.some((i) => i.answerReason || i.justification);
  const header = ['question', 'answer', ...(hasReason ? ['reason'] : []), 'basis'];
  return textTable(
    header,
    items.map((i) => [i.title, i.answer ? verdictLabel(i.answer) : 'not answered', ...(hasReason ? [[i.answerReason, i.justification && `justified: ${i.justification}`].filter(Boolean).join('; ') || '—'] : []), i.source]),
  );
}

function limitBlocks(data: RecordData): Array<Paragraph | Table> {
  const { text } = recordTemplate();
  if (!data.limitSet) return [body(text.noLimitSet, { italic: true })];
  const entries = Object.entries(data.limitSet.limits ?? {});
  return [
    body(fill(text.limitsIntro, { name: data.limitSet.name, version: data.limitSet.version })),
    entries.length ? textTable(['criterion', 'limit', 'source'], entries.map(([k, l]) => [criterionLabel(k), formatQuantity(l!.value, l!.unit), l!.source])) : body('The version holds no limits.', { italic: true }),
    body(text.otherLimits, { italic: true }),
  ];
}

function changeBlocks(data: RecordData): Array<Paragraph | Table> {
  const { text } = recordTemplate();
  if (!data.changes) return [];
  const c = data.changes;
  const none = !c.inputChanges.length && !c.verdictChanges.length;
  return [
    heading(fill(text.changesHeading, { from: c.fromNumber })),
    ...(none ? [body(text.noChanges, { italic: true })] : []),
    ...(c.inputChanges.length ? [subheading('Inputs'), ...c.inputChanges.map((t) => body(`• ${t}`))] : []),
    ...(c.worstChanges.length ? [subheading('Worst values'), ...c.worstChanges.map((t) => body(`• ${t}`))] : []),
    ...(c.verdictChanges.length ? [subheading('Verdicts'), ...c.verdictChanges.map((t) => body(`• ${t}`))] : []),
  ];
}

/** Remarks as threads: each opening remark, its replies beneath it, and whether it was resolved. */
function remarkBlocks(data: RecordData): Array<Paragraph | Table> {
  const { text } = recordTemplate();
  if (!data.remarks.length) return [body(text.noRemarks, { italic: true })];
  const roots = data.remarks.filter((r) => !r.parentId || !data.remarks.some((p) => p.id === r.parentId));
  const rows: string[][] = [];
  const about = (r: RecordData['remarks'][number]) => (r.itemKey ? itemLabel(data.checklist.find((i) => i.itemKey === r.itemKey), r.itemKey) : r.field ? `input ${r.field}` : 'general');
  roots.forEach((root, n) => {
    const replies = data.remarks.filter((r) => r.parentId === root.id);
    const resolved = root.resolved || replies.some((r) => r.resolved);
    rows.push([`${n + 1}`, date(root.createdAt), root.authorName, about(root), root.body, resolved ? 'resolved' : 'open']);
    replies.forEach((r, k) => rows.push([`${n + 1}.${k + 1}`, date(r.createdAt), r.authorName, 'reply', r.body, '']));
  });
  return [textTable(['no.', 'date', 'by', 'about', 'remark', 'resolution'], rows)];
}

function commissioningBlocks(data: RecordData): Array<Paragraph | Table> {
  const { text } = recordTemplate();
  if (data.commissioning === null) return [heading(text.commissioningHeading), body(text.commissioningUnavailable, { italic: true })];
  if (!data.commissioning.length) return [];
  return [
    heading(text.commissioningHeading),
    body(text.commissioningIntro),
    ...data.commissioning.flatMap((f) => [
      subheading(`${f.fileName}${f.caseId ? `, against case ${f.caseId}` : ''}`),
      f.error
        ? body(`Not compared: ${f.error}`, { italic: true })
        : textTable(
            ['joint', 'cable', 'load at the time', 'measured', 'calculated at that load', 'deviation'],
            f.rows.map((r) => [r.jointIndex, r.cable, formatQuantity(r.loadCurrentA, 'A'), formatQuantity(r.measuredV, 'V'), r.calculatedV === null ? '—' : formatQuantity(r.calculatedV, 'V'), r.deviationPct === null ? '—' : formatMarginPct(r.deviationPct)]),
          ),
    ]),
  ];
}

/** The limit drawn on a case's plot: the standing-voltage limit of a load case; faults have none to earth. */
const plotLimit = (data: RecordData, c: CaseResult) =>
  c.kind === 'normal' || c.kind === 'emergency' ? (data.checklist.find((i) => i.itemKey === `standing-voltage-${c.kind}:${c.caseId}`)?.limitValue ?? null) : null;

/** The along-route plot of every case of a bonding study, faults included. */
function plotBlocks(data: RecordData): Paragraph[] {
  if (!data.results || data.results.kind !== 'bonding') return [];
  const results = data.results as BondingResults;
  const { text, layout } = recordTemplate();
  // Profiles are recomputed for the record when not stored (compute-tasks.ts); they cannot be
  // when the inputs changed after the calculation.
  if (results.cases.some((c) => !c.profile)) return [subheading(text.plotHeading), body(text.plotUnavailable, { italic: true })];
  return [
    subheading(text.plotHeading),
    body(text.plotNote, { italic: true }),
    ...results.cases.flatMap((c) => {
      const limit = plotLimit(data, c);
      const png = svgToPng(routePlotSvg(c, limit, layout.plot.widthPx, layout.plot.heightPx));
      return [
        new Paragraph({ keepNext: true, children: [new ImageRun({ type: 'png', data: png, transformation: { width: layout.plot.widthEmuPt, height: layout.plot.heightEmuPt } })] }),
        body(fill(text.plotCaption, { case: `${c.caseId} (${c.name})`, limit: limit === null ? text.plotNoLimit : `the limit of ${formatQuantity(limit, 'V')}` }), { italic: true }),
      ];
    }),
  ];
}
