import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { bondingStudySchema, cableTypeSchema, type CableTypeInput } from '../../../src/lib/schemas/bonding-study.schema';
import { describeIssues } from '../../../src/lib/schemas/study.schema';
import { calculateStudy } from '../../../src/lib/calc';
import { deriveCableParameters } from '../../../src/lib/calc/cable/derive-cable';
import { SHEATH_METALS } from '../../../src/lib/calc/cable/materials';
import { referenceStudyInput } from '../../helpers/reference-study';
import { demoCableTypes } from '../../../scripts/demo-cable-types';

// A cable type entered as construction or as the maker's figures: same engine inputs, same
// results; stored studies read back unchanged; bad construction refused field by field.

const construction = (o: { conductor?: object; screen?: object; overallDiameterMm?: number } = {}): CableTypeInput =>
  ({
    id: 'CON',
    name: 'construction under test (illustrative)',
    entry: 'construction',
    construction: {
      conductor: { material: 'copper', crossSectionMm2: 1000, diameterMm: 38.5, stranding: 'segmental', segmentCount: 5, operatingTemperatureC: 90, ...o.conductor },
      // A screen with its own kind replaces the default one; otherwise it adjusts it.
      screen: o.screen && 'kind' in o.screen ? o.screen : { kind: 'wires', material: 'copper', wireCount: 60, wireDiameterMm: 1.6, diameterUnderWiresMm: 84, layLengthMm: 700, foil: { material: 'aluminium', thicknessMm: 0.25 }, operatingTemperatureC: 75, ...o.screen },
    },
    oversheathThicknessMm: 4.5,
    overallDiameterMm: o.overallDiameterMm ?? 100,
    oversheathWithstandKv: 20,
  }) as CableTypeInput;

const fieldsOf = (input: unknown) => {
  const r = cableTypeSchema.safeParse(input);
  return r.success ? [] : describeIssues(r.error).map((i) => i.field);
};

describe('construction entries', () => {
  it('derive the four engine figures and keep the construction', () => {
    const t = cableTypeSchema.parse(construction());
    if (t.entry !== 'construction') throw new Error('expected construction');
    const d = deriveCableParameters(t.construction);
    expect([t.conductorResistanceOhmPerKm, t.conductorGmrMm, t.sheathMeanDiameterMm, t.sheathResistanceOhmPerKm]).toEqual([d.conductorResistanceOhmPerKm, d.conductorGmrMm, d.sheathMeanDiameterMm, d.sheathResistanceOhmPerKm]);
    expect(t.construction.frequencyHz).toBe(50);
  });

  it('a lead sheath: Rs = ρ20/(π·d·t)·[1 + α(θ − 20)], by hand', () => {
    // IEC 60287-1-1 Table 1 lead: ρ20 = 21.4e-8 Ω·m, α20 = 4.0e-3 /K (from memory). Tube area
    // π·d·t equals (π/4)·[(d + t)² − (d − t)²] (geometry).
    const t = cableTypeSchema.parse(construction({ screen: { kind: 'tubular', material: 'lead', meanDiameterMm: 90, thicknessMm: 2.8, operatingTemperatureC: 70 }, overallDiameterMm: 104 }));
    const areaMm2 = (Math.PI / 4) * (92.8 ** 2 - 87.2 ** 2);
    expect(t.sheathResistanceOhmPerKm).toBeCloseTo((21.4e-8 / (areaMm2 * 1e-6)) * 1000 * (1 + 4.0e-3 * 50), 12);
    expect(t.sheathMeanDiameterMm).toBe(90);
  });

  it('wires and foil in parallel: resistance and share-weighted mean diameter, by hand', () => {
    const t = cableTypeSchema.parse(construction());
    const cu = SHEATH_METALS.copper;
    const al = SHEATH_METALS.aluminium;
    const dw = 84 + 1.6;
    const rw = ((cu.resistivity20OhmM * Math.sqrt(1 + ((Math.PI * dw) / 700) ** 2)) / ((60 * Math.PI * 1.6 ** 2) / 4 / 1e6)) * 1000 * (1 + cu.alpha20PerK * 55);
    const df = 84 + 3.2 + 0.25;
    const rf = (al.resistivity20OhmM / ((Math.PI * df * 0.25) / 1e6)) * 1000 * (1 + al.alpha20PerK * 55);
    expect(t.sheathResistanceOhmPerKm).toBeCloseTo((rw * rf) / (rw + rf), 12);
    const sw = rf / (rw + rf);
    expect(t.sheathMeanDiameterMm).toBeCloseTo(dw ** sw * df ** (1 - sw), 10);
    // The share-weighted diameter lies between the layers.
    expect(t.sheathMeanDiameterMm).toBeGreaterThan(dw);
    expect(t.sheathMeanDiameterMm).toBeLessThan(df);
  });

  it('read back as stored (derived figures included) they parse to the same thing', () => {
    const once = cableTypeSchema.parse(construction());
    expect(cableTypeSchema.parse(JSON.parse(JSON.stringify(once)))).toEqual(once);
  });

  it('a hand-edited derived figure is refused on that field, not replaced', () => {
    const stored = JSON.parse(JSON.stringify(cableTypeSchema.parse(construction())));
    expect(fieldsOf({ ...stored, sheathResistanceOhmPerKm: stored.sheathResistanceOhmPerKm * 1.01 })).toEqual(['sheathResistanceOhmPerKm']);
  });

  it('every demo construction parses (illustrative data, labelled so)', () => {
    for (const t of demoCableTypes) {
      expect(cableTypeSchema.safeParse(t).success, t.id).toBe(true);
      if (t.entry === 'construction') expect(t.name).toMatch(/illustrative construction, not a maker's data/);
    }
  });
});

describe('construction and direct entry give the same engine', () => {
  it('identical results for a study whose cable type is entered either way', () => {
    const derived = cableTypeSchema.parse(construction());
    const direct: CableTypeInput = {
      id: 'CON',
      name: 'the same figures typed in',
      conductorResistanceOhmPerKm: derived.conductorResistanceOhmPerKm,
      conductorGmrMm: derived.conductorGmrMm,
      sheathMeanDiameterMm: derived.sheathMeanDiameterMm,
      sheathResistanceOhmPerKm: derived.sheathResistanceOhmPerKm,
      oversheathThicknessMm: 4.5,
      overallDiameterMm: 100,
      oversheathWithstandKv: 20,
    };
    const study = (cableType: CableTypeInput) =>
      bondingStudySchema.parse(
        referenceStudyInput({
          cableTypes: [cableType],
          circuits: [{ id: 'C1', name: 'circuit 1', cableTypeId: 'CON' }],
          cases: [
            { id: 'LOAD', name: 'load', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 800 }] },
            { id: 'EF', name: 'earth fault', kind: 'earth-fault', durationS: 0.5, earthFault: { circuitId: 'C1', phase: 'a', currentA: 20000 } },
          ],
        }),
      );
    const a = calculateStudy(study(construction()));
    const b = calculateStudy(study(direct));
    expect(a).toEqual(b);
    // And the cable type matters: other figures give other results (so the equality above is not vacuous).
    const c = calculateStudy(study({ ...direct, sheathResistanceOhmPerKm: direct.sheathResistanceOhmPerKm * 2 } as CableTypeInput));
    expect(c).not.toEqual(a);
  });

  it('existing studies parse unchanged: their cable types gain no fields', () => {
    for (const name of ['fernhollow-cross-bonded', 'kestrel-single-point-ecc']) {
      const raw = JSON.parse(readFileSync(`tests/fixtures/studies/${name}.json`, 'utf8'));
      expect(bondingStudySchema.parse(raw).cableTypes, name).toEqual(raw.cableTypes);
    }
  });
});

describe('bad construction is refused by field', () => {
  const cases: Array<[string, unknown, string[]]> = [
    ['unknown entry kind', { ...construction(), entry: 'maker' }, ['entry']],
    ['unknown conductor metal', construction({ conductor: { material: 'gold' } }), ['construction.conductor.material']],
    ['negative cross-section', construction({ conductor: { crossSectionMm2: -1 } }), ['construction.conductor.crossSectionMm2']],
    ['area larger than the circle', construction({ conductor: { diameterMm: 30 } }), ['construction.conductor.diameterMm']],
    ['stranded without a strand count', construction({ conductor: { stranding: 'stranded', segmentCount: undefined } }), ['construction.conductor.strandCount']],
    ['a strand count of no concentric lay', construction({ conductor: { stranding: 'stranded', strandCount: 50, segmentCount: undefined } }), ['construction.conductor.strandCount']],
    ['segmental without its segments', construction({ conductor: { segmentCount: undefined } }), ['construction.conductor.segmentCount']],
    ['R20 typed in Ω/m', construction({ conductor: { resistance20OhmPerKm: 0.0000176 } }), ['construction.conductor.resistance20OhmPerKm']],
    ['conductor at 900 °C', construction({ conductor: { operatingTemperatureC: 900 } }), ['construction.conductor.operatingTemperatureC']],
    ['screen hotter than the conductor', construction({ screen: { operatingTemperatureC: 95 } }), ['construction.screen.operatingTemperatureC']],
    ['screen inside the conductor', construction({ screen: { diameterUnderWiresMm: 30 } }), ['construction.screen.diameterUnderWiresMm']],
    ['more wires than fit', construction({ screen: { wireCount: 400 } }), ['construction.screen.wireCount']],
    ['unknown screen kind', construction({ screen: { kind: 'braid' } }), ['construction.screen.kind']],
    ['unknown key in the screen', construction({ screen: { colour: 'red' } }), ['construction.screen.colour']],
    ['overall diameter smaller than the screen', construction({ overallDiameterMm: 80 }), ['overallDiameterMm']],
    ['direct entry missing a figure', { id: 'D', name: 'd', conductorGmrMm: 10, sheathMeanDiameterMm: 80, sheathResistanceOhmPerKm: 0.1, oversheathThicknessMm: 4, overallDiameterMm: 90, oversheathWithstandKv: 20 }, ['conductorResistanceOhmPerKm']],
    ['direct entry given a construction', { id: 'D', name: 'd', conductorResistanceOhmPerKm: 0.03, conductorGmrMm: 10, sheathMeanDiameterMm: 80, sheathResistanceOhmPerKm: 0.1, oversheathThicknessMm: 4, overallDiameterMm: 90, oversheathWithstandKv: 20, construction: {} }, ['construction']],
  ];
  for (const [what, input, fields] of cases) it(`${what}: ${fields.join(', ')}`, () => expect(fieldsOf(input)).toEqual(fields));

  it('in a study the field is named from the study root', () => {
    const r = bondingStudySchema.safeParse(referenceStudyInput({ cableTypes: [construction({ conductor: { diameterMm: 30 } })], circuits: [{ id: 'C1', name: 'c', cableTypeId: 'CON' }] }));
    expect(r.success).toBe(false);
    if (!r.success) expect(describeIssues(r.error).map((i) => i.field)).toEqual(['cableTypes.0.construction.conductor.diameterMm']);
  });
});
