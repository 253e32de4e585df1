import type { Paragraph, Table } from 'docx';
import type { StudyResults } from '../calc';
import { formatDifferencePct, formatQuantity } from '../format';
import { quantityLabel } from '../compare/labels';
import { textTable } from './record-tables';
import { body, subheading } from './record-paragraphs';
import { jointInWords } from '../calc/bonding/joint-names';

/** Results per case and the worst values, as tables; joints are told by their bay names where the inputs give them. */
export function resultBlocks(results: StudyResults, names: { jointNames?: Array<{ jointIndex: number; name: string }> } = {}): Array<Paragraph | Table> {
  if (results.kind === 'exposure') {
    return [
      textTable(
        ['case', 'EMF along the run, ends open (V)', 'start to remote earth (V)', 'end to remote earth (V)', 'current (A)', 'tolerable touch (V)', 'a.c. density (A/m²)'],
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
      body('The end voltages are to remote earth; the larger is the accessible voltage the checks compare, conservative where the ground at that end is raised by the metalwork’s own electrode.', { italic: true }),
    ];
  }
  const blocks: Array<Paragraph | Table> = [
    subheading('Worst values over all cases'),
    textTable(['quantity', 'value', 'measured', 'case', 'where'], results.worst.map((w) => [quantityLabel(w.quantity), formatQuantity(w.value, w.unit), w.reference ?? (w.unit === 'V' ? 'to remote earth' : '—'), w.caseId, w.where])),
  ];
  if (results.crossChecks.length) {
    blocks.push(
      subheading('Closed-form cross-check'),
      textTable(['quantity', 'case', 'closed form', 'network', 'difference', 'method'], results.crossChecks.map((c) => [c.description, c.caseId, formatQuantity(c.closedForm, c.unit), formatQuantity(c.network, c.unit), formatDifferencePct(c.differencePct), c.method])),
    );
  }
  blocks.push(
    body('Each voltage names its reference. To local earth: sheath end to the earth at that point (link-box electrode or station grid), what a person there or an SVL to earth sees. To remote earth: to earth far away. Across joint: sheath end to sheath end. Local earth rise: the local earth to remote earth.', { italic: true }),
  );
  for (const c of results.cases) {
    blocks.push(
      subheading(`Case ${c.caseId}: ${c.name}`),
      textTable(
        ['point', 'local earth', 'highest sheath V to local earth', 'highest sheath V to remote earth', 'across the joint (V)', 'local earth rise (V)', 'ECC (V, to remote earth)'],
        c.points.map((p) => [
          p.label,
          p.localEarth ? `${LOCAL_EARTH[p.localEarth.kind]}${p.localEarth.resistanceOhm === null ? '' : `, ${formatQuantity(p.localEarth.resistanceOhm, 'Ω')}`}` : '—',
          p.maxToLocalEarthV === undefined || p.maxToLocalEarthV === null ? '—' : formatQuantity(p.maxToLocalEarthV),
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
    if (c.svls.length) {
      blocks.push(
        textTable(
          ['SVL', 'cable', 'connected between', 'voltage across its terminals (V)', 'current', 'continuous rating (V)', 'TOV capability (V)'],
          c.svls.map((s) => [`SVL ${s.svlIndex + 1} at ${jointInWords(names, s.jointIndex)}`, s.cable, s.terminals ?? (s.connection === 'across-joint' ? 'across the joint' : 'sheath to remote earth'), formatQuantity(s.voltageV), s.conducting ? formatQuantity(s.currentA, 'A') : 'blocking', s.continuousRatingV, s.tovRatingV]),
        ),
      );
    }
    const hc = c.handCheck;
    if (hc && hc.referenceCurrentA > 0) {
      blocks.push(
        body(`Hand-check figures, per kA of the case's largest core current (${formatQuantity(hc.referenceCurrentA, 'A')}); EMF open-circuit along each sheath.`, { italic: true }),
        textTable(
          ['cable', 'cross-section', 'EMF (V/km per kA)', 'largest sheath current (A per kA)'],
          hc.emfVPerKmPerKA.map((e) => [e.cable, e.crossSection, formatQuantity(e.value), formatQuantity(hc.sheathCurrentAPerKA.find((x) => x.cable === e.cable)?.value ?? 0)]),
        ),
      );
    }
  }
  if (results.impedanceMatrices?.length) {
    blocks.push(subheading('Per-kilometre impedance matrices with earth return (Ω/km)'));
    for (const m of results.impedanceMatrices) {
      blocks.push(
        body(`${m.crossSection}; sections ${m.sectionIds.join(', ')}.`, { italic: true }),
        textTable(['', ...m.conductors], m.impedanceOhmPerKm.map((row, i) => [m.conductors[i], ...row.map(complexText)])),
      );
    }
  }
  return blocks;
}

const LOCAL_EARTH = { 'station-grid': 'station grid', 'link-box-electrode': 'link-box electrode', 'no-electrode': 'no electrode' } as const;

const complexText = ([re, im]: [number, number]) => `${re.toFixed(5)} ${im < 0 ? '−' : '+'} j${Math.abs(im).toFixed(5)}`;
