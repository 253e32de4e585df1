import type { ManualItem } from '../src/lib/schemas/manual-item.schema';

/** Manual checklist items of the demo limit set, each with where it comes from. */
export const demoManualItems: ManualItem[] = [
  { key: 'link-boxes', text: 'Link boxes are lockable and labelled with a warning of induced voltage.', basis: 'common practice' },
  { key: 'bonding-leads', text: 'Bonding leads are as short as practicable, and concentric where cross-bonded.', basis: 'CIGRE TB 283 (2005), from memory' },
  { key: 'ecc-transposed', text: 'The ECC of every single-point bonded section is transposed at its mid-point, or the reason is recorded.', basis: 'common practice' },
  { key: 'svl-datasheet', text: "SVL ratings are taken from the maker's data sheet, and the data sheet is attached.", basis: 'IEC 60099-4 (metal-oxide arrester ratings), from memory' },
  { key: 'oversheath-test', text: 'An oversheath test after installation is specified.', basis: 'IEC 60840 (tests after installation), from memory' },
  { key: 'continuity-test', text: 'A cross-bonding continuity and link-box test is specified for commissioning.', basis: 'common practice' },
];
