import type { StudyResults } from '../calc';
import { formatQuantity } from '../format';
import { itemLabel, quantityLabel, verdictLabel } from './labels';

export interface WorstChange {
  quantity: string;
  label: string;
  unit: string;
  before: number | null;
  after: number | null;
  /** (after − before)/before, per cent; null when either is missing or before is zero. */
  changePct: number | null;
  text: string;
}

export interface VerdictChange {
  itemKey: string;
  label: string;
  before: string | null;
  after: string | null;
  text: string;
}

type Worst = { quantity: string; value: number; unit: string };
type Item = { itemKey: string; kind: string; title: string; caseId: string | null; status: string; answer?: string | null };

const worstOf = (r: StudyResults | null | undefined): Worst[] => (r && r.kind === 'bonding' ? r.worst : []);

/** The worst values of two calculations side by side: every quantity that either has, with its change. */
export function worstChanges(before: StudyResults | null | undefined, after: StudyResults | null | undefined): WorstChange[] {
  const b = worstOf(before);
  const a = worstOf(after);
  const quantities = [...new Set([...b.map((w) => w.quantity), ...a.map((w) => w.quantity)])];
  return quantities.map((q) => {
    const x = b.find((w) => w.quantity === q);
    const y = a.find((w) => w.quantity === q);
    const unit = (y ?? x)!.unit;
    const changePct = x && y && x.value !== 0 ? ((y.value - x.value) / x.value) * 100 : null;
    const label = quantityLabel(q);
    const show = (w?: Worst) => (w ? formatQuantity(w.value, unit) : 'none');
    const text = x && y && formatQuantity(x.value, unit) === formatQuantity(y.value, unit) ? `${label} unchanged at ${show(y)}` : `${label} ${show(x)} → ${show(y)}${changePct === null ? '' : ` (${changePct >= 0 ? '+' : '−'}${Math.abs(Math.round(changePct))} %)`}`;
    return { quantity: q, label, unit, before: x?.value ?? null, after: y?.value ?? null, changePct, text };
  });
}

/** Checklist verdicts that differ between two revisions (computed verdicts and manual answers). */
export function verdictChanges(before: Item[], after: Item[]): VerdictChange[] {
  const verdict = (i?: Item) => (i ? (i.kind === 'manual' ? (i.answer ?? 'open') : i.status) : null);
  const keys = [...new Set([...before.map((i) => i.itemKey), ...after.map((i) => i.itemKey)])];
  return keys.flatMap((k) => {
    const x = before.find((i) => i.itemKey === k);
    const y = after.find((i) => i.itemKey === k);
    if (verdict(x) === verdict(y)) return [];
    const label = itemLabel(y ?? x, k);
    const text = !x ? `${label}: new check, ${verdictLabel(verdict(y))}` : !y ? `${label}: no longer checked (was ${verdictLabel(verdict(x))})` : `${label}: ${verdictLabel(verdict(x))} → ${verdictLabel(verdict(y))}`;
    return [{ itemKey: k, label, before: verdict(x), after: verdict(y), text }];
  });
}
