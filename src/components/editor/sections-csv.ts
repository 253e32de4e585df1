import Papa from 'papaparse';
import type { PastedSection } from '../../lib/paste/sections-paste';

/** Route sections as CSV with a header (id, lengthM, layoutId, phaseRotation), decimal points. */
export function sectionsToCsv(rows: PastedSection[]): string {
  return Papa.unparse({ fields: ['id', 'lengthM', 'layoutId', 'phaseRotation'], data: rows.map((r) => [r.id, r.lengthM, r.layoutId, r.phaseRotation ?? 0]) }, { newline: '\n' }) + '\n';
}
