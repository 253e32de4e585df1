import type { ChecklistItem, Study } from '../calc';
import type { ManualItem } from '../schemas/manual-item.schema';
import type { ChecklistRow } from '../db/schema';
import { generatedNotApplicableReason, manualItemSubject } from '../workflow/manual-item-subjects';

type NewRow = Omit<ChecklistRow, 'id'>;

/**
 * The checklist of a revision after a calculation: computed items replaced by the new
 * evaluation, manual items kept with their answers (new ones added from the limit set).
 * A manual question whose subject the study lacks is answered "not applicable" by the study;
 * a "not applicable" answer to a question whose subject now exists is dropped. A query stays
 * on an item that still exists; the designer's justification stays on an item that still fails
 * with the same value. Without `study` (renderings that have no inputs at hand) no question is
 * answered by the study.
 */
export function checklistRows(revisionId: string, computed: ChecklistItem[], manual: ManualItem[], existing: ChecklistRow[], study?: Study): NewRow[] {
  const before = new Map(existing.map((e) => [e.itemKey, e]));
  const rows: NewRow[] = computed.map((c, i) => {
    const kept = before.get(c.id);
    const justified = kept?.kind === 'computed' && kept.status === 'fail' && c.status === 'fail' && kept.value === c.value ? kept : undefined;
    return {
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
      answerGenerated: false,
      checkerVerdict: kept?.checkerVerdict === 'query' ? 'query' : null,
      justification: null,
      justifiedBy: null,
      designerJustification: justified?.designerJustification ?? null,
      designerJustifiedBy: justified?.designerJustifiedBy ?? null,
      sortOrder: i,
    };
  });
  manual.forEach((m, i) => {
    const itemKey = `manual:${m.key}`;
    const subject = study ? manualItemSubject(m.key, study) : null;
    const previous = before.get(itemKey);
    const kept = previous?.kind === 'manual' && !previous.answerGenerated && !(subject?.exists && previous.answer === 'not-applicable') ? previous : undefined;
    const generated = subject && !subject.exists;
    rows.push({
      revisionId,
      itemKey,
      kind: 'manual',
      title: m.text,
      status: generated || kept?.answer ? 'answered' : 'open',
      value: null,
      limitValue: null,
      unit: '',
      marginPct: null,
      caseId: null,
      location: null,
      source: m.basis,
      answer: generated ? 'not-applicable' : (kept?.answer ?? null),
      answerReason: generated ? generatedNotApplicableReason(subject, study!) : (kept?.answerReason ?? null),
      answeredBy: generated ? null : (kept?.answeredBy ?? null),
      answerGenerated: !!generated,
      checkerVerdict: previous?.checkerVerdict === 'query' ? 'query' : null,
      justification: null,
      justifiedBy: null,
      designerJustification: null,
      designerJustifiedBy: null,
      sortOrder: 1000 + i,
    });
  });
  return rows;
}
