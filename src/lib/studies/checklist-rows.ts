import type { ChecklistItem } from '../calc';
import type { ManualItem } from '../schemas/manual-item.schema';
import type { ChecklistRow } from '../db/schema';

type NewRow = Omit<ChecklistRow, 'id'>;

/**
 * The checklist of a revision after a calculation: computed items replaced by the new
 * evaluation, manual items kept with their answers (new ones added from the limit set).
 */
export function checklistRows(revisionId: string, computed: ChecklistItem[], manual: ManualItem[], existing: ChecklistRow[]): NewRow[] {
  const rows: NewRow[] = computed.map((c, i) => ({
    revisionId,
    itemKey: c.id,
    kind: 'computed',
    title: c.title,
    status: c.status,
    value: c.value,
    limitValue: c.limit,
    unit: c.unit,
    marginPct: c.marginPct,
    caseId: c.caseId,
    location: c.where,
    source: c.source,
    answer: null,
    answerReason: null,
    answeredBy: null,
    checkerVerdict: null,
    justification: null,
    justifiedBy: null,
    sortOrder: i,
  }));
  manual.forEach((m, i) => {
    const kept = existing.find((e) => e.kind === 'manual' && e.itemKey === `manual:${m.key}`);
    rows.push({
      revisionId,
      itemKey: `manual:${m.key}`,
      kind: 'manual',
      title: m.text,
      status: kept?.answer ? 'answered' : 'open',
      value: null,
      limitValue: null,
      unit: '',
      marginPct: null,
      caseId: null,
      location: null,
      source: m.basis,
      answer: kept?.answer ?? null,
      answerReason: kept?.answerReason ?? null,
      answeredBy: kept?.answeredBy ?? null,
      checkerVerdict: null,
      justification: null,
      justifiedBy: null,
      sortOrder: 1000 + i,
    });
  });
  return rows;
}
