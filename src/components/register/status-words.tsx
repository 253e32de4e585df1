/** Colours of the register's status words (the words themselves come from the server). */
export const STATUS_TONE: Record<string, string> = {
  'no issued study': 'bg-paper text-ink-soft border-rule',
  'needs review': 'bg-fail/10 text-fail border-fail',
  overdue: 'bg-fail/10 text-fail border-fail',
  'due within 30 days': 'bg-caution/10 text-caution border-caution',
  covered: 'bg-pass/10 text-pass border-pass',
};

/** Chart colours per status, in the register's order. */
export const STATUS_COLOUR: Record<string, string> = {
  'no issued study': '#4a5668',
  'needs review': '#b3261e',
  overdue: '#e0701a',
  'due within 30 days': '#8a5a00',
  covered: '#2f6b3a',
};

export const STATUSES = ['no issued study', 'needs review', 'overdue', 'due within 30 days', 'covered'] as const;

export function StatusBadge({ status }: { status: string }) {
  return <span data-status={status} className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold ${STATUS_TONE[status] ?? ''}`}>{status}</span>;
}
