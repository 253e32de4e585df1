import { ImageRun, Paragraph, type Table } from 'docx';
import { and, asc, eq, isNotNull } from 'drizzle-orm';
import type { Database } from '../db/client';
import { bondingChoices, explorations, users } from '../db/schema';
import type { Appraisal, Tornado } from '../calc/explore';
import type { PlacementResult, SweepResult } from '../explore/run-exploration';
import { formatIsoDate as date } from '../format';
import { body, heading, subheading } from './record-paragraphs';
import { textTable } from './record-tables';
import { recordTemplate } from './record-template';
import { svgToPng } from './route-plot';
import { sweepCurves } from '../explore/sweep-series';

// The design-exploration section of the record: the bonding option chosen with its reason, and
// every exploration saved with the revision (appraisal table; sweep figure and table; tornado;
// placement), each with its inputs hash, engine version and grid so it can be reproduced.

export interface RecordExplorations {
  choice: { optionKey: string; reason: string; chosenBy: string; chosenAt: Date } | null;
  saved: Array<{ id: string; kind: string; params: unknown; inputsHash: string; engineVersion: string; savedAt: Date | null; savedBy: string; result: unknown }>;
}

export async function gatherExplorations(db: Database, revisionId: string): Promise<RecordExplorations> {
  const people = new Map((await db.select({ id: users.id, name: users.name }).from(users)).map((u) => [u.id, u.name]));
  const rows = await db.select().from(explorations).where(and(eq(explorations.revisionId, revisionId), isNotNull(explorations.savedAt))).orderBy(asc(explorations.createdAt));
  const [choice] = await db.select().from(bondingChoices).where(eq(bondingChoices.revisionId, revisionId));
  return {
    choice: choice ? { optionKey: choice.optionKey, reason: choice.reason, chosenBy: people.get(choice.chosenBy) ?? '', chosenAt: choice.chosenAt } : null,
    saved: rows.map((r) => ({ id: r.id, kind: r.kind, params: r.params, inputsHash: r.inputsHash, engineVersion: r.engineVersion, savedAt: r.savedAt, savedBy: r.savedBy ? (people.get(r.savedBy) ?? '') : '', result: r.result })),
  };
}

const num = (v: number | null | undefined, digits = 3) => (v === null || v === undefined ? '—' : String(Number(v.toPrecision(digits))));

/** Largest number of sweep rows printed; longer sweeps print every k-th point and say so. */
const MAX_TABLE_ROWS = 200;

export function explorationBlocks(x: RecordExplorations | undefined): Array<Paragraph | Table> {
  if (!x || (!x.choice && !x.saved.length)) return [];
  const out: Array<Paragraph | Table> = [heading('Design exploration')];
  out.push(body('Explorations derive studies from this revision\'s inputs and calculate them with the same engine; they support the choice of arrangement and show sensitivity. They do not replace the owner\'s standards, local codes or the judgement of a competent engineer.', { italic: true }));
  if (x.choice) out.push(body(`Bonding arrangement chosen: ${x.choice.optionKey}, by ${x.choice.chosenBy} on ${date(x.choice.chosenAt)}. Reason: ${x.choice.reason}`));
  for (const e of x.saved) {
    const provenance = `Saved by ${e.savedBy} on ${date(e.savedAt)}; inputs hash ${e.inputsHash}; engine ${e.engineVersion}.`;
    if (e.kind === 'appraisal') out.push(...appraisalBlocks(e.result as Appraisal, provenance, x.choice?.optionKey));
    else if (e.kind === 'sweep') out.push(...sweepBlocks(e.result as SweepResult, provenance));
    else if (e.kind === 'tornado') out.push(...tornadoBlocks(e.result as Tornado, provenance));
    else if (e.kind === 'placement') out.push(...placementBlocks(e.result as PlacementResult, provenance));
  }
  return out;
}

function appraisalBlocks(a: Appraisal, provenance: string, chosen?: string): Array<Paragraph | Table> {
  return [
    subheading('Bonding options appraisal'),
    body(provenance),
    textTable(
      ['option', 'standing V to local earth', 'λ1', 'sheath losses kW/km', 'fault V on sheath', 'fault V across joint', 'SVL duty %', 'link boxes', 'worst margin %'],
      a.rows.map((r) => {
        const name = `${r.label}${r.isCurrent ? ' (current)' : ''}${r.key === chosen ? ' (chosen)' : ''}`;
        const f = r.figures;
        return f
          ? [name, num(f.worstStandingV), num(f.lossFactor), num(f.lossesKwPerKm), num(f.faultSheathV), num(f.jointFaultV), f.svlDutyPct === null ? 'no SVLs' : num(f.svlDutyPct), f.linkBoxes, num(f.worstMarginPct)]
          : [name, `not calculated: ${r.notAvailable ?? ''}`, '', '', '', '', '', '', ''];
      }),
    ),
    ...a.rows.filter((r) => r.assumptions.length).map((r) => body(`${r.label}: ${r.assumptions.join(' ')}`, { italic: true })),
  ];
}

/** The criterion the sweep figure shows: the first that fails, else the standing voltage, else the first with a limit. */
function figureCriterion(s: SweepResult): string | undefined {
  const qs = s.points.flatMap((p) => p.quantities ?? []);
  return s.firstFailures[0]?.criterion ?? (qs.some((q) => q.criterion === 'standing-voltage-normal') ? 'standing-voltage-normal' : qs.find((q) => q.limit !== null)?.criterion);
}

/** Curve colours of the figure, light to dark along the second input (as on the Explore tab). */
const CURVE_COLOURS = ['#e0a66a', '#c9824a', '#a4522a', '#7f3a1d', '#5b7fa6', '#1f5f8b', '#16406a', '#16202e'];

export function sweepFigureSvg(s: SweepResult, criterion: string, width: number, height: number): string {
  const { curves, limit, unit } = sweepCurves(s, criterion);
  const drawn = curves.map((c) => ({ ...c, points: c.points.flatMap((p) => (p.y === null ? [] : [{ x: p.x, y: p.y }])) }));
  const pts = drawn.flatMap((c) => c.points);
  const labelled = curves.length > 1;
  const m = { left: 90, right: labelled ? 130 : 30, top: 30, bottom: 70 };
  const xMin = Math.min(...pts.map((p) => p.x));
  const xMax = Math.max(...pts.map((p) => p.x), xMin + 1e-9);
  const yMax = Math.max(limit ?? 0, ...pts.map((p) => p.y), 1e-9) * 1.1;
  const px = (x: number) => m.left + ((x - xMin) / (xMax - xMin)) * (width - m.left - m.right);
  const py = (y: number) => height - m.bottom - (y / yMax) * (height - m.top - m.bottom);
  const parts = [`<rect width="${width}" height="${height}" fill="#ffffff"/>`];
  for (let k = 0; k <= 5; k++) {
    parts.push(`<line x1="${m.left}" x2="${width - m.right}" y1="${py((yMax * k) / 5)}" y2="${py((yMax * k) / 5)}" stroke="#e4dfd4"/><text x="${m.left - 10}" y="${py((yMax * k) / 5) + 6}" font-size="18" text-anchor="end">${num((yMax * k) / 5, 3)}</text>`);
    const xv = xMin + ((xMax - xMin) * k) / 5;
    parts.push(`<text x="${px(xv)}" y="${height - m.bottom + 28}" font-size="18" text-anchor="middle">${num(xv, 3)}</text>`);
  }
  const esc = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;');
  drawn.forEach((c, k) => {
    if (!c.points.length) return;
    const colour = labelled ? CURVE_COLOURS[Math.round((k * (CURVE_COLOURS.length - 1)) / (curves.length - 1))] : '#a4522a';
    parts.push(`<path d="${c.points.map((p, i) => `${i ? 'L' : 'M'}${px(p.x).toFixed(1)},${py(p.y).toFixed(1)}`).join('')}" fill="none" stroke="${colour}" stroke-width="2.5"/>`);
    // Each curve named at its right-hand end by the second input's value.
    const end = c.points[c.points.length - 1];
    if (labelled && c.secondValue !== null) parts.push(`<text x="${px(end.x) + 8}" y="${py(end.y) + 6}" font-size="15" fill="${colour}">${esc(num(c.secondValue))}</text>`);
  });
  if (limit !== null) parts.push(`<line x1="${m.left}" x2="${width - m.right}" y1="${py(limit)}" y2="${py(limit)}" stroke="#b3261e" stroke-width="2.5" stroke-dasharray="12 8"/><text x="${m.left + 8}" y="${py(limit) - 8}" font-size="16" fill="#b3261e">limit ${num(limit)} ${unit}</text>`);
  const fail = s.firstFailures.find((f) => f.criterion === criterion);
  if (fail) parts.push(`<line x1="${px(fail.values[0])}" x2="${px(fail.values[0])}" y1="${m.top}" y2="${height - m.bottom}" stroke="#b3261e" stroke-width="2"/><text x="${px(fail.values[0]) + 6}" y="${m.top + 18}" font-size="16" fill="#b3261e">first fails</text>`);
  parts.push(`<line x1="${m.left}" x2="${width - m.right}" y1="${height - m.bottom}" y2="${height - m.bottom}" stroke="#16202e"/><line x1="${m.left}" x2="${m.left}" y1="${m.top}" y2="${height - m.bottom}" stroke="#16202e"/>`);
  if (labelled) parts.push(`<text x="${width - m.right + 8}" y="${m.top - 8}" font-size="15">${esc(s.axes[1].label.split(',')[0])}</text>`);
  parts.push(`<text x="${(width + m.left) / 2}" y="${height - 16}" font-size="18" text-anchor="middle">${esc(s.axes[0].label)}</text>`);
  parts.push(`<text x="24" y="${(height - m.bottom) / 2}" font-size="18" text-anchor="middle" transform="rotate(-90 24 ${(height - m.bottom) / 2})">${esc(`${criterion}${unit ? ` (${unit})` : ''}`)}</text>`);
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" font-family="DejaVu Sans, Liberation Sans, sans-serif" fill="#16202e">${parts.join('')}</svg>`;
}

/** The figure's caption: what is plotted against what, and for a two-input sweep which curves are drawn. */
export function sweepFigureCaption(s: SweepResult, criterion: string): string {
  const base = `Figure: ${criterion} against ${s.axes[0].label}, with its limit and the first failing point`;
  if (s.axes.length < 2) return `${base}.`;
  const { curves, secondCount } = sweepCurves(s, criterion);
  const values = curves.map((c) => num(c.secondValue)).join(', ');
  return `${base}; one curve per value of ${s.axes[1].label} (${values}${curves.length < secondCount ? `: ${curves.length} of ${secondCount} values, evenly spaced; the table lists every point` : ''}), each labelled at its end.`;
}

function sweepBlocks(s: SweepResult, provenance: string): Array<Paragraph | Table> {
  const { layout } = recordTemplate();
  const grid = s.axes.map((a) => `${a.label} from ${num(a.fromValue)} to ${num(a.toValue)} in ${a.points} points (current design ${num(a.baseValue)})`).join('; ');
  const criterion = figureCriterion(s);
  const step = Math.max(1, Math.ceil(s.points.length / MAX_TABLE_ROWS));
  const shown = s.points.filter((_, i) => i % step === 0 || i === s.points.length - 1);
  return [
    subheading('Sensitivity sweep'),
    body(`${provenance} Grid: ${grid}.`),
    ...(s.firstFailures.length ? s.firstFailures.map((f) => body(`${f.criterion} first fails at ${s.axes.length > 1 ? f.values.map((v, k) => `${num(v)} (${s.axes[k].label})`).join(' with ') : num(f.values[0])}.`)) : [body('Every check passes at every grid point.')]),
    ...(criterion
      ? [
          new Paragraph({ keepNext: true, children: [new ImageRun({ type: 'png', data: svgToPng(sweepFigureSvg(s, criterion, layout.plot.widthPx, layout.plot.heightPx)), transformation: { width: layout.plot.widthEmuPt, height: layout.plot.heightEmuPt } })] }),
          body(sweepFigureCaption(s, criterion), { italic: true }),
        ]
      : []),
    ...(step > 1 ? [body(`The table lists every ${step}th point of ${s.points.length}, and the last.`, { italic: true })] : []),
    textTable(
      [...s.axes.map((a) => a.label), 'worst margin %', 'failing checks'],
      shown.map((p) => [...p.values.map((v) => num(v, 4)), p.error ? `not calculated: ${p.error}` : num(p.worstMarginPct ?? null), (p.failing ?? []).join(', ') || '—']),
    ),
  ];
}

function tornadoBlocks(t: Tornado, provenance: string): Array<Paragraph | Table> {
  return [
    subheading('Tornado: inputs ranked by their effect on the worst margin'),
    body(`${provenance} Worst margin of the design: ${num(t.baseMarginPct)} %.`),
    textTable(['input', 'low value', 'high value', 'worst margin at low %', 'worst margin at high %', 'swing (percentage points)'], t.bars.map((b) => [b.label, num(b.lowValue), num(b.highValue), num(b.lowMarginPct), num(b.highMarginPct), num(b.swingPct)])),
  ];
}

function placementBlocks(p: PlacementResult, provenance: string): Array<Paragraph | Table> {
  return [
    subheading('Joint-bay placement'),
    body(`${provenance} Current design: worst standing voltage ${num(p.current.worstStandingV)} V, λ1 ${num(p.current.lossFactor)}; suggestion: ${p.suggested ? `${num(p.suggested.worstStandingV)} V, λ1 ${num(p.suggested.lossFactor)}` : 'none feasible'}.`),
    textTable(
      ['major section', 'current minor lengths m', 'suggested m', 'residual share current %', 'suggested %', 'notes'],
      p.placement.majorSections.map((m) => [m.sectionIds.join(', '), m.currentLengthsM.map((v) => num(v, 5)).join(' / '), m.suggestedLengthsM ? m.suggestedLengthsM.map((v) => num(v, 5)).join(' / ') : '—', num(m.currentImbalancePct), num(m.suggestedImbalancePct), [...m.currentViolations, m.reason ?? ''].filter(Boolean).join(' ') || '—']),
    ),
  ];
}
