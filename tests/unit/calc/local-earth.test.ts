import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { bondingStudySchema, type BondingStudyInput } from '../../../src/lib/schemas/bonding-study.schema';
import { describeIssues } from '../../../src/lib/schemas/study.schema';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { SVL_OFF_TAG, SVL_TAG, buildBondingNetwork } from '../../../src/lib/calc/bonding/network-model';
import { caseSources } from '../../../src/lib/calc/bonding/case-sources';
import { type Complex, abs, add, polar, sub } from '../../../src/lib/calc/complex';
import { referenceStudy, referenceStudyInput, relativeError, sections } from '../../helpers/reference-study';

// Issue 10 §1 and §2: SVLs and link boxes connect to the local earth node, and every voltage
// names its reference. The checks are Kirchhoff's laws on the solved network (hand
// reasoning written out in each test) and the issue's own figure for the demo route.

const phasor = (magnitude: number, angleDeg: number): Complex => polar(magnitude, angleDeg);

const crossBonded = (overrides: Partial<BondingStudyInput> = {}) =>
  referenceStudy({
    sections: sections(480, 510, 530),
    bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }],
    earthing: { routeStartOhm: 0.5, routeEndOhm: 0.8, linkBoxOhm: 4 },
    svls: [
      { jointIndex: 1, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 },
      { jointIndex: 2, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 },
    ],
    cases: [{ id: 'FE', name: 'earth fault, SVLs conducting', kind: 'earth-fault', durationS: 1, svlsConducting: true, earthFault: { circuitId: 'C1', phase: 'a', currentA: 20000, beyond: 'end' } }],
    ...overrides,
  });

const stationOpenEnd = referenceStudy({
  bonding: [{ kind: 'single-point', sectionIds: ['S1'], earthedAt: 'end' }],
  earthing: { routeStartOhm: 2, routeEndOhm: 0.25, linkBoxOhm: 5 },
  svls: [{ jointIndex: 0, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 }],
  cases: [{ id: 'FE', name: 'earth fault beyond the start', kind: 'earth-fault', durationS: 1, earthFault: { circuitId: 'C1', phase: 'a', currentA: 20000, beyond: 'start' } }],
});

describe('§1 SVLs at their real terminals', () => {
  it("an SVL's voltage equals the difference of its two terminal nodes (Kirchhoff's voltage law)", () => {
    for (const study of [stationOpenEnd, crossBonded()]) {
      const model = buildBondingNetwork(study);
      const c = study.cases[0];
      const solution = model.builder.compile(new Set([c.svlsConducting ? SVL_TAG : SVL_OFF_TAG])).solve(caseSources(study, model, c));
      const results = calculateBondingStudy(study).cases[0];
      expect(model.svls.length).toBeGreaterThan(0);
      model.svls.forEach((s, k) => {
        const terminals = sub(solution.voltage(s.a), solution.voltage(s.b));
        expect(relativeError(results.svls[k].voltageV, abs(terminals))).toBeLessThan(1e-12);
        // Terminal b of an SVL to earth is the box's earth node, never remote earth.
        expect(s.b).toBe(model.jointNodes[s.joint].earthBar);
      });
    }
  });

  it('an open-end SVL beside a station sees sheath minus the station earth bar, not sheath to remote earth', () => {
    const r = calculateBondingStudy(stationOpenEnd).cases[0];
    const start = r.points.find((p) => p.jointIndex === 0)!;
    for (const svl of r.svls) {
      const end = start.sheathEnds.find((e) => e.cable === svl.cable)!;
      expect(relativeError(svl.voltageV, end.toLocalEarthV!)).toBeLessThan(1e-12);
      // The station grid has risen by kilovolts: to remote earth is a different, smaller figure here.
      expect(Math.abs(svl.voltageV - end.voltageV)).toBeGreaterThan(100);
    }
    expect(start.localEarth!.kind).toBe('station-grid');
    expect(start.localEarth!.voltageV).toBeGreaterThan(1000);
  });

  it("a conducting SVL's current flows through its link-box electrode (Kirchhoff's current law at the box)", () => {
    const r = calculateBondingStudy(crossBonded()).cases[0];
    for (const jointIndex of [1, 2]) {
      const box = r.points.find((p) => p.jointIndex === jointIndex)!;
      const svlSum = r.svls.filter((s) => s.jointIndex === jointIndex).reduce((sum, s) => add(sum, phasor(s.currentA, s.currentAngleDeg)), { re: 0, im: 0 });
      expect(abs(svlSum)).toBeGreaterThan(10);
      // The box earth node joins the SVL star point and the electrode only: Σ I_svl = V_box / R_electrode.
      const electrode = phasor(box.localEarth!.voltageV / 4, box.localEarth!.angleDeg);
      expect(abs(sub(svlSum, electrode)) / abs(svlSum)).toBeLessThan(1e-9);
      expect(relativeError(box.localEarth!.electrodeCurrentA, abs(svlSum))).toBeLessThan(1e-9);
    }
  });

  it('the link-box electrode resistance now changes the result where SVLs conduct (it was never used at cross-bonding boxes)', () => {
    const at = (linkBoxOhm: number) => calculateBondingStudy(crossBonded({ earthing: { routeStartOhm: 0.5, routeEndOhm: 0.8, linkBoxOhm } })).cases[0].svls[0].currentA;
    expect(relativeError(at(1), at(20))).toBeGreaterThan(0.01);
  });

  it('a per-joint override at a cross-bonding box is used, and "no electrode" leaves the star point on the SVLs alone', () => {
    const plain = calculateBondingStudy(crossBonded()).cases[0];
    const overridden = calculateBondingStudy(crossBonded({ earthing: { routeStartOhm: 0.5, routeEndOhm: 0.8, linkBoxOhm: 4, overrides: [{ jointIndex: 1, resistanceOhm: 0.5 }] } })).cases[0];
    expect(overridden.points.find((p) => p.jointIndex === 1)!.localEarth!.resistanceOhm).toBe(0.5);
    expect(relativeError(overridden.svls[0].currentA, plain.svls[0].currentA)).toBeGreaterThan(0.01);

    const none = calculateBondingStudy(crossBonded({ earthing: { routeStartOhm: 0.5, routeEndOhm: 0.8, linkBoxOhm: 4, overrides: [{ jointIndex: 1, noElectrode: true }] } })).cases[0];
    const box = none.points.find((p) => p.jointIndex === 1)!;
    expect(box.localEarth).toMatchObject({ kind: 'no-electrode', resistanceOhm: null, electrodeCurrentA: 0 });
    // No electrode: the SVL currents at the box have nowhere to go but each other (Σ I = 0).
    const sum = none.svls.filter((s) => s.jointIndex === 1).reduce((acc, s) => add(acc, phasor(s.currentA, s.currentAngleDeg)), { re: 0, im: 0 });
    expect(abs(sum)).toBeLessThan(1e-9 * Math.max(...none.svls.map((s) => s.currentA)));
  });

  it("the demo route's earth fault: the open-end SVL sees about 5.1 kV, not the 2.4 kV to remote earth (the issue's figures)", () => {
    const study = bondingStudySchema.parse(JSON.parse(readFileSync('tests/fixtures/studies/kestrel-single-point-ecc.json', 'utf8')));
    const fe = calculateBondingStudy(study).cases.find((c) => c.caseId === 'FE')!;
    const worstSvl = Math.max(...fe.svls.map((s) => s.voltageV));
    const worstToRemote = Math.max(...fe.points.find((p) => p.jointIndex === 0)!.sheathEnds.map((e) => e.voltageV));
    expect(worstSvl).toBeGreaterThan(4900);
    expect(worstSvl).toBeLessThan(5300);
    expect(worstToRemote).toBeGreaterThan(2300);
    expect(worstToRemote).toBeLessThan(2500);
  });
});

describe('§1 earthing overrides that cannot apply are refused, naming the joint', () => {
  const issues = (input: BondingStudyInput) => {
    const parsed = bondingStudySchema.safeParse(input);
    expect(parsed.success).toBe(false);
    return parsed.success ? [] : describeIssues(parsed.error);
  };

  it('an override at a straight-through joint', () => {
    const input = referenceStudyInput({ sections: sections(500, 500), bonding: [{ kind: 'solid', sectionIds: ['S1', 'S2'] }], earthing: { routeStartOhm: 1, routeEndOhm: 1, linkBoxOhm: 5, overrides: [{ jointIndex: 1, resistanceOhm: 2 }] } });
    expect(issues(input)).toContainEqual({ field: 'earthing.overrides.0.jointIndex', message: expect.stringContaining('Joint 1 is a straight-through joint') });
  });

  it('"no electrode" where sheaths are earthed', () => {
    const input = referenceStudyInput({ earthing: { routeStartOhm: 1, routeEndOhm: 1, linkBoxOhm: 5, overrides: [{ jointIndex: 0, noElectrode: true }] } });
    expect(issues(input)).toContainEqual({ field: 'earthing.overrides.0.noElectrode', message: expect.stringContaining('Joint 0 is not a cross-bonding link box') });
  });

  it('both or neither of a resistance and "no electrode"', () => {
    const both = referenceStudyInput({ earthing: { routeStartOhm: 1, routeEndOhm: 1, linkBoxOhm: 5, overrides: [{ jointIndex: 1, resistanceOhm: 2, noElectrode: true }] } });
    expect(issues(both)[0].field).toBe('earthing.overrides.0.resistanceOhm');
    const neither = referenceStudyInput({ earthing: { routeStartOhm: 1, routeEndOhm: 1, linkBoxOhm: 5, overrides: [{ jointIndex: 1 }] } });
    expect(issues(neither)[0].field).toBe('earthing.overrides.0.resistanceOhm');
  });
});

describe('§2 every voltage names its reference', () => {
  it('an open-end voltage to the station grid differs from the voltage to remote earth by the grid GPR phasor', () => {
    const r = calculateBondingStudy(stationOpenEnd).cases[0];
    const start = r.points.find((p) => p.jointIndex === 0)!;
    const gpr = phasor(start.localEarth!.voltageV, start.localEarth!.angleDeg);
    expect(abs(gpr)).toBeGreaterThan(1000);
    for (const e of start.sheathEnds) {
      const toRemote = phasor(e.voltageV, e.angleDeg);
      const toGrid = phasor(e.toLocalEarthV!, e.toLocalEarthAngleDeg!);
      expect(abs(sub(sub(toRemote, toGrid), gpr)) / abs(gpr)).toBeLessThan(1e-12);
    }
    // Hand bound: the start grid (2 Ω) carries at most the whole 20 kA fault current, so its
    // rise is at most 40 kV, and its electrode current is its rise over 2 Ω (Ohm's law).
    expect(start.localEarth!.voltageV).toBeLessThanOrEqual(20000 * 2 * (1 + 1e-12));
    expect(relativeError(start.localEarth!.electrodeCurrentA, start.localEarth!.voltageV / 2)).toBeLessThan(1e-12);
  });

  it('ECC ends report both references, and an earthed end is at its local earth', () => {
    const study = bondingStudySchema.parse(JSON.parse(readFileSync('tests/fixtures/studies/kestrel-single-point-ecc.json', 'utf8')));
    const fe = calculateBondingStudy(study).cases.find((c) => c.caseId === 'FE')!;
    const ends = fe.points.flatMap((p) => p.eccV);
    expect(ends.length).toBeGreaterThan(0);
    for (const p of fe.points) {
      for (const e of p.eccV) {
        expect(e.toLocalEarthV).toBeLessThan(1e-9 * Math.max(1, e.voltageV));
        expect(relativeError(e.voltageV, p.localEarth!.voltageV)).toBeLessThan(1e-12);
      }
    }
  });

  it('the standing-voltage check and worst value use the voltage to the local earth, and say so', async () => {
    const { evaluateBondingCompliance } = await import('../../../src/lib/calc/compliance');
    const study = referenceStudy({ ...stationOpenEnd, cases: [{ id: 'N', name: 'n', kind: 'normal', currents: [{ circuitId: 'C1', currentA: 1000 }] }] } as never);
    const results = calculateBondingStudy(study);
    const start = results.cases[0].points.find((p) => p.jointIndex === 0)!;
    const expected = Math.max(...start.sheathEnds.map((e) => e.toLocalEarthV!));
    const [item] = evaluateBondingCompliance(study, results, { name: 't', version: 1, limits: {} }).filter((i) => i.criterion === 'standing-voltage-normal');
    expect(item.value).toBe(expected);
    expect(item.where).toContain('to the local earth');
    expect(results.worst.find((w) => w.quantity === 'standing-voltage-normal')!.reference).toContain('local earth');
  });
});
