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

export function sweepFigureSvg(s: SweepResult, criterion: string, width: number, height: number): string {
  const rows = s.points.filter((p) => p.values.slice(1).every((v, k) => v === s.points[0].values[k + 1]));
  const pts = rows.flatMap((p) => {
    const q = p.quantities?.find((x) => x.criterion === criterion);
    return q ? [{ x: p.values[0], y: q.value }] : [];
  });
  const q0 = rows.flatMap((p) => p.quantities ?? []).find((x) => x.criterion === criterion);
  const limit = q0?.limit ?? null;
  const m = { left: 90, right: 30, top: 30, bottom: 70 };
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
  parts.push(`<path d="${pts.map((p, i) => `${i ? 'L' : 'M'}${px(p.x).toFixed(1)},${py(p.y).toFixed(1)}`).join('')}" fill="none" stroke="#a4522a" stroke-width="2.5"/>`);
  if (limit !== null) parts.push(`<line x1="${m.left}" x2="${width - m.right}" y1="${py(limit)}" y2="${py(limit)}" stroke="#b3261e" stroke-width="2.5" stroke-dasharray="12 8"/><text x="${m.left + 8}" y="${py(limit) - 8}" font-size="16" fill="#b3261e">limit ${num(limit)} ${q0?.unit ?? ''}</text>`);
  const fail = s.firstFailures.find((f) => f.criterion === criterion);
  if (fail) parts.push(`<line x1="${px(fail.values[0])}" x2="${px(fail.values[0])}" y1="${m.top}" y2="${height - m.bottom}" stroke="#b3261e" stroke-width="2"/><text x="${px(fail.values[0]) + 6}" y="${m.top + 18}" font-size="16" fill="#b3261e">first fails</text>`);
  parts.push(`<line x1="${m.left}" x2="${width - m.right}" y1="${height - m.bottom}" y2="${height - m.bottom}" stroke="#16202e"/><line x1="${m.left}" x2="${m.left}" y1="${m.top}" y2="${height - m.bottom}" stroke="#16202e"/>`);
  const esc = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;');
  parts.push(`<text x="${(width + m.left) / 2}" y="${height - 16}" font-size="18" text-anchor="middle">${esc(s.axes[0].label)}</text>`);
  parts.push(`<text x="24" y="${(height - m.bottom) / 2}" font-size="18" text-anchor="middle" transform="rotate(-90 24 ${(height - m.bottom) / 2})">${esc(`${criterion}${q0?.unit ? ` (${q0.unit})` : ''}`)}</text>`);
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" font-family="DejaVu Sans, Liberation Sans, sans-serif" fill="#16202e">${parts.join('')}</svg>`;
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
    ...(s.firstFailures.length ? s.firstFailures.map((f) => body(`${f.criterion} first fails at ${f.values.map((v) => num(v)).join(', ')}.`)) : [body('Every check passes at every grid point.')]),
    ...(criterion
      ? [
          new Paragraph({ keepNext: true, children: [new ImageRun({ type: 'png', data: svgToPng(sweepFigureSvg(s, criterion, layout.plot.widthPx, layout.plot.heightPx)), transformation: { width: layout.plot.widthEmuPt, height: layout.plot.heightEmuPt } })] }),
          body(`Figure: ${criterion} against ${s.axes[0].label}, with its limit and the first failing point.`, { italic: true }),
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
