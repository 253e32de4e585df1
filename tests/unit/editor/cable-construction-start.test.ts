import { describe, expect, it } from 'vitest';
import { cableTypeSchema } from '../../../src/lib/schemas/bonding-study.schema';
import { deriveCableParameters } from '../../../src/lib/calc/cable/derive-cable';
import { DERIVED_FIGURES, STARTING_CONSTRUCTION } from '../../../src/components/editor/CableConstructionFields';

// The construction a study cable type starts from when switched to "its construction" in the
// editor must itself be valid, and a stored entry carries exactly the figures it derives.

describe('the starting construction of a study cable type', () => {
  const type = { id: 'CT1', name: 'n', oversheathThicknessMm: 4.5, overallDiameterMm: 105, oversheathWithstandKv: 20, entry: 'construction' as const, construction: STARTING_CONSTRUCTION };

  it('is a valid construction whose derived figures the schema adds', () => {
    const parsed = cableTypeSchema.parse(type);
    const derived = deriveCableParameters(parsed.entry === 'construction' ? parsed.construction : (undefined as never));
    for (const key of DERIVED_FIGURES) expect(parsed[key]).toBe(derived[key]);
  });

  it('refuses a stale derived figure by field once the construction changes', () => {
    const stored = cableTypeSchema.parse(type);
    const edited = { ...stored, construction: { ...STARTING_CONSTRUCTION, conductor: { ...STARTING_CONSTRUCTION.conductor, crossSectionMm2: 800 } } };
    const r = cableTypeSchema.safeParse(edited);
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].path).toEqual(['conductorResistanceOhmPerKm']);
    // The editor drops the derived figures on every edit, so they are derived again.
    const dropped = Object.fromEntries(Object.entries(edited).filter(([k]) => !(DERIVED_FIGURES as readonly string[]).includes(k)));
    expect(cableTypeSchema.safeParse(dropped).success).toBe(true);
  });
});
