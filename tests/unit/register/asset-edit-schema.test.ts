import { describe, expect, it } from 'vitest';
import { assetEditSchema } from '../../../src/lib/schemas/register.schema';
import { issueFields } from '../../../src/lib/server/http';

// A change to a register asset (PATCH /api/assets/:id): the field errors the endpoint answers with.
const fieldsOf = (body: unknown) => {
  const r = assetEditSchema.safeParse(body);
  return r.success ? [] : issueFields(r.error, '(body)');
};

describe('a change to an asset', () => {
  it('refuses an unknown key naming that key, not as an empty change', () => {
    expect(fieldsOf({ nmae: 'Typo' })).toEqual([{ field: 'nmae', message: 'Unknown field "nmae": check the spelling, or leave it out.' }]);
    expect(fieldsOf({ name: 'Kept', colour: 'red', size: 3 }).map((f) => f.field)).toEqual(['colour', 'size']);
  });

  it('names an unknown key beside a bad known field', () => {
    expect(fieldsOf({ name: '  ', extra: 1 }).map((f) => f.field).sort()).toEqual(['extra', 'name']);
  });

  it('still says "Change at least one field" for an empty change', () => {
    expect(fieldsOf({})).toEqual([{ field: 'name', message: 'Change at least one field.' }]);
  });

  it('accepts a change of known fields', () => {
    expect(assetEditSchema.parse({ code: ' LBX-02 ', inServiceOn: null })).toEqual({ code: 'LBX-02', inServiceOn: null });
  });
});
