import type { ChecklistItem, StudyResults } from '../src/lib/calc';
import type { LimitSet } from '../src/lib/schemas/limit-set.schema';
import { formatQuantity } from '../src/lib/format';

const CAUTION =
  'Caution: these results support, and do not replace, the judgement of a competent engineer, the owner\'s standards and local regulations.';

const fmt = formatQuantity;

/** A readable plain-text summary: worst values, cross-checks, checklist verdicts. */
export function formatSummary(title: string, results: StudyResults, checklist: ChecklistItem[], limits: LimitSet): string {
  const lines = [`${title}`, `engine ${results.engineVersion}; limits: ${limits.name} v${limits.version}`, ''];
  if (results.kind === 'bonding') {
    lines.push(`Route length ${fmt(results.routeLengthM, 'm')}`, '', 'Worst values:');
    for (const w of results.worst) lines.push(`  ${w.quantity.padEnd(28)} ${fmt(w.value, w.unit).padStart(12)}  case ${w.caseId}, ${w.where}`);
    if (results.crossChecks.length) {
      const worst = results.crossChecks.reduce((a, b) => (Math.abs(b.differencePct) > Math.abs(a.differencePct) ? b : a));
      lines.push('', `Closed-form cross-checks: ${results.crossChecks.length}, largest difference ${worst.differencePct.toExponential(2)} % (${worst.description})`);
    }
  } else {
    lines.push('Cases:');
    for (const c of results.cases) {
      lines.push(`  ${c.caseId.padEnd(10)} EMF ${fmt(c.emfV, 'V')}, accessible ${fmt(c.accessibleV, 'V')}${c.tolerable ? `, tolerable touch ${fmt(c.tolerable.touchV, 'V')}` : ''}`);
    }
  }
  lines.push('', 'Checklist:');
  for (const item of checklist) {
    const verdict = item.status === 'pass' ? 'PASS' : item.status === 'fail' ? 'FAIL' : 'NO LIMIT';
    const limit = item.limit === null ? 'no limit set' : `limit ${fmt(item.limit, item.unit)}, margin ${item.marginPct!.toFixed(1)} %`;
    lines.push(`  [${verdict.padEnd(8)}] ${item.title} (case ${item.caseId}): ${fmt(item.value, item.unit)}; ${limit}; ${item.where}`);
  }
  lines.push('', CAUTION);
  return lines.join('\n');
}
