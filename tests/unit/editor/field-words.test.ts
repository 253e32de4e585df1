import { describe, expect, it } from 'vitest';
import { fieldInWords } from '../../../src/components/editor/field-words';
import { defaultBondingInputs } from '../../../src/lib/studies/default-inputs';

const study = {
  ...defaultBondingInputs('t'),
  svls: [{ jointIndex: 2 }],
  cases: [{ id: 'K1', internalFault: { fromStart: { currentA: 1 } } }],
  eccs: [{ id: 'E1', transposedAtJoints: [1, 5] }],
  jointNames: [{ jointIndex: 3, name: '' }],
  bondingLeadLength: { lengthM: 0 },
};

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
    ['eccs.0.transposedAtJoints.1', 'Transposition joint 2 of ECC E1'],
    ['eccs.0.transposedAtJoints', 'Transposition joints of ECC E1'],
    ['jointNames.0.name', 'Name of joint bay at joint 3'],
    ['bondingLeadLength.lengthM', 'Length of bonding leads by length'],
    ['bondingLeadLength.resistanceMilliohmPerM', 'Lead resistance per metre of bonding leads by length'],
  ])('%s → %s', (path, words) => expect(fieldInWords(path, study)).toBe(words));
});
