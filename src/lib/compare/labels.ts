// Human words for the stored keys people would otherwise see (worst-value quantities,
// checklist verdicts, revision steps).

export const QUANTITY_LABEL: Record<string, string> = {
  'standing-voltage-normal': 'Standing voltage, normal load',
  'standing-voltage-emergency': 'Standing voltage, emergency load',
  'route-voltage-normal': 'Highest sheath voltage along the route, normal load',
  'sheath-voltage-fault': 'Sheath voltage during a fault',
  'joint-voltage-fault': 'Voltage across a joint during a fault',
  'svl-voltage': 'Voltage across an SVL',
  'sheath-current': 'Sheath current',
  'ecc-current': 'ECC current',
  'loss-factor': 'Sheath loss factor',
  'earth-potential-rise': 'Earth potential rise',
};

export const quantityLabel = (q: string) => QUANTITY_LABEL[q] ?? q.replace(/-/g, ' ');

export const VERDICT_LABEL: Record<string, string> = { pass: 'PASS', fail: 'FAIL', 'no-limit': 'NO LIMIT', open: 'OPEN', yes: 'yes', no: 'no', 'not-applicable': 'not applicable' };

export const verdictLabel = (s: string | null | undefined) => (s ? (VERDICT_LABEL[s] ?? s) : '—');

/** A checklist item in words: its title and, for a computed item, the case. */
export const itemLabel = (item: { title: string; caseId?: string | null } | undefined, key: string) =>
  item ? `${item.title}${item.caseId ? `, case ${item.caseId}` : ''}` : itemKeyLabel(key);

export const CRITERION_LABEL: Record<string, string> = {
  'standing-voltage-normal': 'Standing voltage to local earth, normal load',
  'standing-voltage-emergency': 'Standing voltage to local earth, emergency load',
  'joint-voltage-fault': 'Voltage across a joint during a fault',
  'loss-factor': 'Sheath loss factor',
  'ecc-current-fault': 'ECC current during a fault',
  'metalwork-voltage-normal': 'Steady induced voltage on metalwork',
  'induced-emf-fault': 'Induced EMF during a fault',
  'ac-current-density': 'A.c. current density at a coating defect',
  'svl-tov': 'SVL voltage during a fault against its TOV capability',
  'svl-continuous': 'SVL standing voltage against its continuous rating',
  'svl-energy': 'SVL energy absorbed while conducting',
};

export const criterionLabel = (k: string) => CRITERION_LABEL[k] ?? k.replace(/-/g, ' ');

/**
 * A stored checklist key in words when the item itself is not at hand:
 * `joint-voltage-fault:F3` → "Voltage across a joint during a fault, case F3";
 * `svl-tov:F3:0` → "… case F3, SVL 1" (SVLs are counted from 1 wherever people see them).
 */
export function itemKeyLabel(key: string): string {
  if (key.startsWith('manual:')) {
    const words = key.slice('manual:'.length).replace(/-/g, ' ');
    return words.charAt(0).toUpperCase() + words.slice(1);
  }
  const [criterion, caseId, extra] = key.split(':');
  const parts = [criterionLabel(criterion)];
  if (caseId) parts.push(`case ${caseId}`);
  if (extra !== undefined) parts.push(criterion.startsWith('svl-') && /^\d+$/.test(extra) ? `SVL ${Number(extra) + 1}` : extra);
  return parts.join(', ');
}
