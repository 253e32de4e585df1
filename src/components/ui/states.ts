/** How each revision state reads on screen (our words; the stored names stay technical). */
export const STATE_LABEL: Record<string, string> = {
  draft: 'Drafting',
  ready_for_check: 'Waiting for check',
  in_check: 'Being checked',
  returned: 'Returned to designer',
  checked: 'Checked, awaiting approval',
  issued: 'Issued',
  withdrawn: 'Withdrawn',
  superseded: 'Superseded',
};

export const STATE_TONE: Record<string, string> = {
  draft: 'bg-paper text-ink border-rule',
  ready_for_check: 'bg-copper-light text-copper-dark border-copper',
  in_check: 'bg-copper-light text-copper-dark border-copper',
  returned: 'bg-fail/10 text-fail border-fail',
  checked: 'bg-caution/10 text-caution border-caution',
  issued: 'bg-pass/10 text-pass border-pass',
  withdrawn: 'bg-paper text-ink-soft border-rule',
  superseded: 'bg-paper text-ink-soft border-rule',
};
