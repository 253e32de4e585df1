import { describe, expect, it } from 'vitest';
import { removeCircuit } from '../../../src/lib/route-edits/circuit-edits';
import { bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';
import { defaultBondingInputs } from '../../../src/lib/studies/default-inputs';

describe('removing a circuit', () => {
  it('takes its placements, currents and the cases that fault it, says so, and leaves a valid study', () => {
    const s = defaultBondingInputs('t');
    s.circuits.push({ id: 'C2', name: 'two', cableTypeId: 'CT1' });
    s.layouts[0].circuits.push({ circuitId: 'C2', formation: 'trefoil', spacingM: 0.105, depthM: 1.2, centreXM: 1 });
    for (const c of s.cases) c.currents!.push({ circuitId: 'C2', currentA: 500, angleDeg: 0 });
    s.cases.push({ id: 'E2', name: 'earth fault on C2', kind: 'earth-fault', durationS: 1, earthFault: { circuitId: 'C2', phase: 'a', currentA: 10000 } });
    const { study, notes } = removeCircuit(s, 'C2');
    expect(study.circuits.map((c) => c.id)).toEqual(['C1']);
    expect(study.layouts[0].circuits.map((p) => p.circuitId)).toEqual(['C1']);
    expect(study.cases.map((c) => c.id)).toEqual(['LOAD', 'F3']);
    expect(study.cases.flatMap((c) => c.currents!.map((x) => x.circuitId))).toEqual(['C1', 'C1']);
    expect(notes).toEqual(['Circuit C2 removed with its place in every layout and its currents.', 'Case E2 faulted C2 and is removed.']);
    expect(bondingStudySchema.safeParse(study).success).toBe(true);
  });
});
