import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { fieldWords } from '../../../src/lib/schemas/plain-messages';
import { bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';

// Input errors read as words that name the field, never in the parser's own terms.

describe('plain input messages', () => {
  it('names fields in words with their units', () => {
    expect(fieldWords(['sections', 2, 'lengthM'])).toBe('Length (m)');
    expect(fieldWords(['code'])).toBe('Code');
    expect(fieldWords(['soilResistivityOhmM'])).toBe('Soil resistivity (Ω·m)');
    expect(fieldWords([])).toBe('This value');
  });

  it('says what is wrong with each kind of bad value', () => {
    const schema = z.object({ code: z.string().min(1), depthM: z.number().positive(), kind: z.enum(['normal', 'fault']), items: z.array(z.number()).min(1), note: z.string().max(3) }).strict();
    const messages = (value: unknown) => schema.safeParse(value).error!.issues.map((i) => i.message);
    expect(messages({ depthM: 'deep', kind: 'other', items: [], note: 'long', extra: 1 })).toEqual([
      'Code is required.',
      'Depth (m) must be a number.',
      'Kind must be one of: normal, fault.',
      'Items needs at least 1 entry.',
      'Note must be at most 3 characters.',
      'Unknown field "extra": check the spelling.',
    ]);
    expect(messages({ code: '', depthM: 0, kind: 'normal', items: [1], note: '' })).toEqual(['Code must not be empty.', 'Depth (m) must be greater than 0.']);
  });

  it('leaves a schema’s own message in place', () => {
    const r = bondingStudySchema.safeParse({});
    expect(r.success).toBe(false);
    for (const i of r.error!.issues) expect(i.message).not.toMatch(/^Invalid input|^Too (small|big)|expected \w+, received/);
  });
});
