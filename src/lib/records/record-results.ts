import type { Paragraph, Table } from 'docx';
import type { StudyResults } from '../calc';
import { formatQuantity } from '../format';
import { textTable } from './record-tables';
import { subheading } from './record-paragraphs';

/** Results per case and the worst values, as tables. */
export function resultBlocks(results: StudyResults): Array<Paragraph | Table> {
  if (results.kind === 'exposure') {
    return [
      textTable(
        ['case', 'EMF (V)', 'start (V)', 'end (V)', 'current (A)', 'tolerable touch (V)', 'a.c. density (A/m²)'],
        results.cases.map((c) => [
          `${c.caseId}: ${c.name}`,
          formatQuantity(c.emfV),
          formatQuantity(c.startV),
          formatQuantity(c.endV),
          formatQuantity(c.currentA),
          c.tolerable ? formatQuantity(c.tolerable.touchV) : '—',
          c.acCurrentDensityAPerM2 === undefined ? '—' : formatQuantity(c.acCurrentDensityAPerM2),
        ]),
      ),
    ];
  }
  const blocks: Array<Paragraph | Table> = [
    subheading('Worst values over all cases'),
    textTable(['quantity', 'value', 'case', 'where'], results.worst.map((w) => [w.quantity.replace(/-/g, ' '), formatQuantity(w.value, w.unit), w.caseId, w.where])),
  ];
  if (results.crossChecks.length) {
    blocks.push(
      subheading('Closed-form cross-check'),
      textTable(['quantity', 'case', 'closed form', 'network', 'difference (%)', 'method'], results.crossChecks.map((c) => [c.description, c.caseId, formatQuantity(c.closedForm, c.unit), formatQuantity(c.network, c.unit), c.differencePct.toExponential(2), c.method])),
    );
  }
  for (const c of results.cases) {
    blocks.push(
      subheading(`Case ${c.caseId}: ${c.name}`),
      textTable(
        ['point', 'highest sheath voltage (V)', 'across the joint (V)', 'earth (V)', 'ECC (V)'],
        c.points.map((p) => [
          p.label,
          formatQuantity(p.maxV),
          p.acrossJoint.length ? formatQuantity(Math.max(...p.acrossJoint.map((a) => a.voltageV))) : '—',
          p.earthBarV === undefined ? '—' : formatQuantity(p.earthBarV),
          p.eccV.map((e) => `${e.eccId} ${formatQuantity(e.voltageV)}`).join('; ') || '—',
        ]),
      ),
      textTable(
        ['cable', 'largest sheath current (A)', 'loss factor'],
        c.sheathCurrents.map((s) => [s.cable, formatQuantity(s.maxA), (() => { const l = c.lossFactors.find((x) => x.cable === s.cable); return l ? formatQuantity(l.lossFactor) : '—'; })()]),
      ),
    );
    if (c.svls.length) blocks.push(textTable(['SVL', 'cable', 'voltage (V)', 'continuous rating (V)', 'TOV capability (V)'], c.svls.map((s) => [`joint ${s.jointIndex} (${s.connection})`, s.cable, formatQuantity(s.voltageV), s.continuousRatingV, s.tovRatingV])));
  }
  return blocks;
}
