import { describe, expect, it } from 'vitest';
import { CASE_KINDS, caseOfKind } from '../../../src/components/editor/case-shapes';
import { bondingStudySchema, caseKinds } from '../../../src/lib/schemas/bonding-study.schema';
import { defaultBondingInputs } from '../../../src/lib/studies/default-inputs';

// Changing a case's kind in the form must give it exactly the fields the schema wants for that
// kind (the schema refuses a field that belongs to another kind), so a new study stays valid.

describe('case kinds in the form', () => {
  it('offers every kind the schema has', () => {
    expect(CASE_KINDS.map(([k]) => k).sort()).toEqual([...caseKinds].sort());
  });

  it.each(caseKinds.map((k) => [k]))('a load case turned into %s validates, keeping id and name', (kind) => {
    const study = defaultBondingInputs('t');
    const changed = caseOfKind(study.cases[0] as never, kind, ['C1']);
    expect(changed).toMatchObject({ id: 'LOAD', name: 'Normal load', kind });
    const parsed = bondingStudySchema.safeParse({ ...study, cases: [study.cases[1], changed] });
    expect(parsed.success ? [] : parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`)).toEqual([]);
  });

  it('a fault turned back into load carries no fault fields', () => {
    const study = defaultBondingInputs('t');
    const fault = caseOfKind(study.cases[0] as never, 'internal-fault', ['C1']);
    const load = caseOfKind(fault, 'emergency', ['C1']);
    expect(Object.keys(load).sort()).toEqual(['currents', 'id', 'kind', 'name', 'svlsConducting']);
  });
});
