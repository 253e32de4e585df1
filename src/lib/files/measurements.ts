import type { BondingResults } from '../calc/bonding/results';
import { circuitCurrentA } from '../calc/bonding/case-sources';
import { cellNumber, parseCsv } from '../csv/csv-text';
import type { BondingStudy } from '../schemas/bonding-study.schema';

/** One commissioning reading: standing voltage at a link box on one sheath, at a known load. */
export interface Measurement {
  jointIndex: number;
  cable: string;
  measuredV: number;
  loadCurrentA: number;
}

/**
 * Reads a commissioning CSV with the columns joint, cable, measured_v, load_a (a header row
 * is required; order free). Returns the rows, or every line that is wrong.
 */
export function parseMeasurements(text: string): { rows: Measurement[] } | { errors: string[] } {
  const csv = parseCsv(text);
  const missing = ['joint', 'cable', 'measured_v', 'load_a'].filter((c) => !csv.header.includes(c));
  if (missing.length) return { errors: [`The header row lacks ${missing.join(', ')}: expected joint, cable, measured_v, load_a.`] };
  const rows: Measurement[] = [];
  const errors: string[] = [...csv.errors];
  for (const { line, cells } of csv.rows) {
    const num = (name: string) => cellNumber(cells[name], csv.delimiter);
    const row = { jointIndex: num('joint'), cable: cells.cable, measuredV: num('measured_v'), loadCurrentA: num('load_a') };
    if (!Number.isInteger(row.jointIndex) || row.jointIndex < 0) errors.push(`Line ${line}: joint must be a joint number (0, 1, 2 …).`);
    else if (!row.cable) errors.push(`Line ${line}: give the cable (for example C1-a).`);
    else if (!Number.isFinite(row.measuredV) || row.measuredV < 0) errors.push(`Line ${line}: measured_v must be a voltage of zero or more.`);
    else if (!Number.isFinite(row.loadCurrentA) || row.loadCurrentA <= 0) errors.push(`Line ${line}: load_a must be the load current at the time, above zero.`);
    else rows.push(row);
  }
  if (!rows.length && !errors.length) errors.push('The file has a header but no readings.');
  return errors.length ? { errors } : { rows };
}

export interface Comparison extends Measurement {
  chainageM: number | null;
  /** The calculated voltage of that sheath end, scaled linearly to the measured load. */
  calculatedV: number | null;
  deviationPct: number | null;
  /** The current of the compared case, to scale readings up for the route plot. */
  caseCurrentA: number;
}

/**
 * Sets each reading beside the calculation of the first normal-load case, scaled to the load at
 * the time (standing voltages are proportional to current: a property of the linear network).
 */
export function compareMeasurements(study: BondingStudy, results: BondingResults, rows: Measurement[]): { caseId: string; rows: Comparison[] } {
  const c = results.cases.find((x) => x.kind === 'normal') ?? results.cases[0];
  const studyCase = study.cases.find((x) => x.id === c.caseId)!;
  return {
    caseId: c.caseId,
    rows: rows.map((m) => {
      const point = c.points.find((p) => p.jointIndex === m.jointIndex);
      const ends = point?.sheathEnds.filter((e) => e.cable === m.cable) ?? [];
      const caseCurrent = circuitCurrentA(studyCase, m.cable.split('-')[0]);
      if (!point || !ends.length || caseCurrent <= 0) return { ...m, chainageM: point?.chainageM ?? null, calculatedV: null, deviationPct: null, caseCurrentA: caseCurrent };
      const calculatedV = (Math.max(...ends.map((e) => e.voltageV)) * m.loadCurrentA) / caseCurrent;
      return { ...m, chainageM: point.chainageM, calculatedV, deviationPct: calculatedV === 0 ? null : ((m.measuredV - calculatedV) / calculatedV) * 100, caseCurrentA: caseCurrent };
    }),
  };
}
