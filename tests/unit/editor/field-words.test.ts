import { describe, expect, it } from 'vitest';
import { fieldInWords } from '../../../src/components/editor/field-words';
import { defaultBondingInputs } from '../../../src/lib/studies/default-inputs';

const study = { ...defaultBondingInputs('t'), svls: [{ jointIndex: 2 }], cases: [{ id: 'K1', internalFault: { fromStart: { currentA: 1 } } }] };

describe('field paths in words', () => {
  it.each([
    ['sections.1.lengthM', 'Length of section S2'],
    ['title', 'Title'],
    ['earthing.linkBoxOhm', 'Earth resistance at link boxes of earthing'],
    ['svls.0.tovRatingV', 'TOV capability of SVL at joint 2'],
    ['cases.0.internalFault.fromStart.currentA', 'Current of infeed from the start of internal fault of case K1'],
    ['layouts.0.circuits.0.spacingM', 'Spacing of circuit C1 of layout L1'],
    ['sections', 'Sections'],
    ['bonding.0', 'Bonding group 1'],
  ])('%s → %s', (path, words) => expect(fieldInWords(path, study)).toBe(words));
});
