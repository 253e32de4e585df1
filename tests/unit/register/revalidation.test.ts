import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { applyReasons, reviewReasons, valueAt } from '../../../src/lib/register/revalidation';
import type { SystemData } from '../../../src/lib/db/schema/register';

// Which assumptions new site data makes non-conservative. The rule (fault current below the new
// level, duration shorter than the new clearance, grid resistance below the new one, load below
// the new maximum) is common practice for keeping a bonding study valid; the study is the
// invented demo route fixture (20 kA earth fault, 31.5 kA three-phase, 1 s, grids 0.2 Ω / 0.3 Ω,
// 850 A normal load on C1).
const study = JSON.parse(readFileSync('tests/fixtures/studies/fernhollow-cross-bonded.json', 'utf8'));
const exposure = JSON.parse(readFileSync('tests/fixtures/studies/marrow-lane-fence-exposure.json', 'utf8'));
const none: SystemData = { threePhaseFaultKa: null, earthFaultKa: null, clearanceTimeS: null, gridResistanceOhm: null, maxLoads: [] };
const site = { siteLinked: true, siteEnd: null, circuitLoads: [] };

describe('reasons a published version gives for review (table of cases)', () => {
  it.each<[string, Partial<SystemData>, Partial<typeof site> | object, string[]]>([
    ['earth-fault level above the study', { earthFaultKa: 25 }, {}, ['cases.3.earthFault.currentA']],
    ['earth-fault level equal to the study: still conservative', { earthFaultKa: 20 }, {}, []],
    ['earth-fault level below the study', { earthFaultKa: 15 }, {}, []],
    ['three-phase level above the study', { threePhaseFaultKa: 40 }, {}, ['cases.2.currents.0.currentA']],
    ['three-phase level below the study', { threePhaseFaultKa: 31.5 }, {}, []],
    ['longer clearance: every fault case', { clearanceTimeS: 1.2 }, {}, ['cases.2.durationS', 'cases.3.durationS']],
    ['shorter clearance', { clearanceTimeS: 0.5 }, {}, []],
    ['higher grid resistance, either end', { gridResistanceOhm: 0.25 }, {}, ['earthing.routeStartOhm']],
    ['higher grid resistance above both ends', { gridResistanceOhm: 0.5 }, {}, ['earthing.routeStartOhm', 'earthing.routeEndOhm']],
    ['higher grid resistance at the end the site stands at', { gridResistanceOhm: 0.25 }, { siteEnd: 'end' }, []],
    ['higher grid resistance at the start', { gridResistanceOhm: 0.25 }, { siteEnd: 'start' }, ['earthing.routeStartOhm']],
    ['fault data of a site the study is not linked to', { earthFaultKa: 50, clearanceTimeS: 3 }, { siteLinked: false }, []],
    ['higher maximum load on the circuit', {}, { siteLinked: false, circuitLoads: [{ assetCode: 'K1', studyCircuitId: 'C1', maxLoadA: 900 }] }, ['cases.0.currents.0.currentA']],
    ['a single-circuit study needs no circuit id', {}, { siteLinked: false, circuitLoads: [{ assetCode: 'K1', studyCircuitId: null, maxLoadA: 900 }] }, ['cases.0.currents.0.currentA']],
    ['lower maximum load', {}, { siteLinked: false, circuitLoads: [{ assetCode: 'K1', studyCircuitId: 'C1', maxLoadA: 800 }] }, []],
    ['a load for another circuit of the study', {}, { siteLinked: false, circuitLoads: [{ assetCode: 'K2', studyCircuitId: 'C9', maxLoadA: 5000 }] }, []],
  ])('%s', (_name, data, ctx, paths) => {
    const reasons = reviewReasons(study, { ...none, ...data }, { ...site, ...ctx });
    expect(reasons.map((r) => r.path)).toEqual(paths);
    for (const r of reasons) {
      expect(valueAt(study, r.path)).toBe(r.before);
      expect(r.sentence).not.toMatch(/cases\.|undefined|NaN/);
    }
  });

  it('says each reason in words with both figures', () => {
    const [r] = reviewReasons(study, { ...none, earthFaultKa: 25 }, site);
    expect(r.sentence).toBe('The earth-fault current of case "Phase-to-earth through fault 20 kA beyond Kestrel Bay" is 20 kA; the site\'s earth-fault level is now 25 kA.');
    expect([r.before, r.after]).toEqual([20000, 25000]);
  });

  it('compares an exposure study on its fault cases only', () => {
    const faultCases = exposure.cases.filter((c: { kind: string }) => c.kind === 'fault');
    const reasons = reviewReasons(exposure, { ...none, earthFaultKa: 100, gridResistanceOhm: 100, clearanceTimeS: 0.01 }, site);
    expect(reasons.filter((r) => r.kind === 'earth-fault').length).toBe(faultCases.reduce((n: number, c: { currents: unknown[] }) => n + c.currents.length, 0));
    expect(reasons.some((r) => r.kind === 'grid-resistance')).toBe(false);
  });

  it('writes confirmed values into a copy of the inputs', () => {
    const reasons = reviewReasons(study, { ...none, earthFaultKa: 25, clearanceTimeS: 1.2 }, site);
    const next = applyReasons(study, reasons.filter((r) => r.kind === 'earth-fault'));
    expect(valueAt(next, 'cases.3.earthFault.currentA')).toBe(25000);
    expect(valueAt(next, 'cases.3.durationS')).toBe(1);
    expect(study.cases[3].earthFault.currentA).toBe(20000);
  });
});
