import type { Paragraph, Table } from 'docx';
import type { BondingStudy } from '../schemas/bonding-study.schema';
import type { ExposureStudy } from '../schemas/exposure-study.schema';
import { textTable } from './record-tables';
import { bondingLeadImpedance } from '../calc/bonding/bonding-lead';
import { jointInWords, jointShortLabel } from '../calc/bonding/joint-names';
import { formatNumber } from '../format';
import { subheading } from './record-paragraphs';

/** The study's inputs as tables, in the order an engineer checks them. */
export function inputBlocks(inputs: BondingStudy | ExposureStudy): Array<Paragraph | Table> {
  return inputs.kind === 'bonding' ? bondingInputs(inputs) : exposureInputs(inputs);
}

function bondingInputs(s: BondingStudy): Array<Paragraph | Table> {
  return [
    subheading('General'),
    textTable(['frequency', 'soil resistivity', 'bonding lead'], [[`${s.frequencyHz} Hz`, `${s.soilResistivityOhmM} Ω·m`, bondingLeadText(s)]]),
    subheading('Cable data'),
    textTable(
      ['cable type', 'conductor R (Ω/km)', 'conductor GMR (mm)', 'sheath mean dia. (mm)', 'sheath R (Ω/km)', 'oversheath (mm)', 'overall dia. (mm)', 'oversheath withstand (kV)'],
      s.cableTypes.map((t) => [`${t.id}: ${t.name}`, t.conductorResistanceOhmPerKm, t.conductorGmrMm, t.sheathMeanDiameterMm, t.sheathResistanceOhmPerKm, t.oversheathThicknessMm, t.overallDiameterMm, t.oversheathWithstandKv]),
    ),
    subheading('Circuits and formations'),
    textTable(['circuit', 'cable type'], s.circuits.map((c) => [`${c.id}: ${c.name}`, c.cableTypeId])),
    textTable(
      ['layout', 'circuit', 'formation', 'spacing / positions', 'depth (m)'],
      s.layouts.flatMap((l) =>
        l.circuits.map((c) => [l.id, c.circuitId, c.formation, c.formation === 'coordinates' ? c.positions.map((p) => `(${p.xM}, ${p.depthM})`).join(' ') : `${c.spacingM} m`, c.formation === 'coordinates' ? '—' : c.depthM]),
      ),
    ),
    subheading('Route sections'),
    textTable(['section', 'length (m)', 'layout', 'cable transposition', 'joint at its end'], s.sections.map((x, i) => [x.id, x.lengthM, x.layoutId, x.phaseRotation ? `shift ${x.phaseRotation}` : 'none', jointShortLabel(s, i + 1)])),
    ...(s.jointNames?.length ? [textTable(['joint', 'joint bay name'], [...s.jointNames].sort((a, b) => a.jointIndex - b.jointIndex).map((n) => [n.jointIndex, n.name]))] : []),
    subheading('Bonding'),
    textTable(['group', 'arrangement', 'sections'], s.bonding.map((g, i) => [i + 1, g.kind === 'single-point' ? `single-point, earthed at the ${g.earthedAt}` : g.kind, g.sectionIds.join(', ')])),
    subheading('Earthing, ECCs and SVLs'),
    textTable(
      ['route start (Ω)', 'route end (Ω)', 'link boxes (Ω)', 'other joints'],
      [[s.earthing.routeStartOhm, s.earthing.routeEndOhm, s.earthing.linkBoxOhm, s.earthing.overrides.map((o) => `${jointInWords(s, o.jointIndex)}: ${o.noElectrode ? 'no electrode' : `${o.resistanceOhm} Ω`}`).join('; ') || '—']],
    ),
    ...(s.eccs.length ? [textTable(['ECC', 'R (Ω/km)', 'GMR (mm)', 'runs', 'transposition points'], s.eccs.map((e) => [`${e.id}: ${e.name}`, e.resistanceOhmPerKm, e.gmrMm, `${e.fromSectionId} to ${e.toSectionId}`, eccCrossingsText(s, e)]))] : []),
    ...(s.svls.length ? [textTable(['SVL at joint', 'connection', 'continuous rating (V)', 'TOV capability (V)'], s.svls.map((v) => [jointInWords(s, v.jointIndex), v.connection, v.continuousRatingV, v.tovRatingV]))] : []),
    subheading('Cases'),
    textTable(
      ['case', 'kind', 'currents', 'duration (s)'],
      s.cases.map((c) => [
        `${c.id}: ${c.name}`,
        c.kind,
        c.earthFault ? `${c.earthFault.currentA} A in ${c.earthFault.circuitId}-${c.earthFault.phase}, fault beyond the ${c.earthFault.beyond}` : c.currents.map((x) => `${x.circuitId} ${x.currentA} A`).join('; '),
        c.durationS ?? '—',
      ]),
    ),
  ];
}

/** The lead impedance as entered, and when given by length, the total it comes to. */
function bondingLeadText(s: BondingStudy): string {
  const lead = bondingLeadImpedance(s);
  const total = `${formatNumber(lead.ohm.re * 1000)} + j${formatNumber(lead.ohm.im * 1000)} mΩ`;
  const byLength = s.bondingLeadLength;
  if (!byLength) return total;
  const r = byLength.resistanceMilliohmPerM === undefined
    ? `resistance of ${s.bondingLeads!.crossSectionMm2} mm² ${s.bondingLeads!.material} (ρ20/A at ${s.adiabatic.initialC} °C, IEC 60287-1-1 Table 1 and eq. 2)`
    : `${byLength.resistanceMilliohmPerM} mΩ/m`;
  return `${byLength.lengthM} m per lead, ${r}, reactance ${byLength.reactanceMilliohmPerM ?? 0} mΩ/m: ${total}`;
}

/** Where an ECC crosses to its mirror position, in words. */
export function eccCrossingsText(s: Pick<BondingStudy, 'jointNames'>, e: Pick<BondingStudy['eccs'][number], 'transposedAtMidpoint' | 'transposedAtJoints'>): string {
  if (e.transposedAtMidpoint) return 'at the middle of its run';
  if (e.transposedAtJoints?.length) return `at ${[...e.transposedAtJoints].sort((a, b) => a - b).map((j) => jointInWords(s, j)).join(', ')}`;
  return 'none';
}

function exposureInputs(s: ExposureStudy): Array<Paragraph | Table> {
  const o = s.object;
  return [
    subheading('General'),
    textTable(['frequency', 'soil resistivity', 'body weight', 'surface layer'], [[`${s.frequencyHz} Hz`, `${s.soilResistivityOhmM} Ω·m`, `${s.touch.bodyWeightKg} kg`, s.touch.surfaceLayer ? `${s.touch.surfaceLayer.resistivityOhmM} Ω·m, ${s.touch.surfaceLayer.thicknessM} m` : 'none']]),
    subheading('Source conductors'),
    textTable(['source', 'x (m)', 'y (m)'], s.sources.map((x) => [`${x.id} ${x.name}`, x.xM, x.yM])),
    subheading('Exposed metalwork'),
    textTable(
      ['object', 'type', 'position (m)', 'parallel length (m)', 'R (Ω/km)', 'earthing', 'screening factor'],
      [[o.name, o.type, `(${o.xM}, ${o.yM})`, o.parallelLengthM, o.resistanceOhmPerKm, `${o.earthing} (${o.earthStartOhm} / ${o.earthEndOhm} Ω)`, o.screeningFactor]],
    ),
    subheading('Cases'),
    textTable(['case', 'kind', 'currents', 'duration (s)'], s.cases.map((c) => [`${c.id}: ${c.name}`, c.kind, c.currents.map((x) => `${x.sourceId} ${x.currentA} A∠${x.angleDeg}°`).join('; '), c.durationS ?? '—'])),
  ];
}
