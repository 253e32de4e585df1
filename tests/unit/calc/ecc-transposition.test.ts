import { describe, expect, it } from 'vitest';
import { type Complex as MathComplex, abs, add, complex, divide, multiply } from 'mathjs';
import { bondingStudySchema, type BondingStudyInput } from '../../../src/lib/schemas/bonding-study.schema';
import { calculateBondingStudy } from '../../../src/lib/calc/bonding/solve-bonding';
import { checkBondingStudy } from '../../../src/lib/calc/bonding/study-checks';
import { eccCrossingsText } from '../../../src/lib/records/record-inputs';
import { decimals, referenceValues, relative } from '../../helpers/validation';

// ECC transposition points: the joints where an ECC crosses to its mirror position. Checked
// against the closed form for the ECC–earth loop of a single-point bonded run (docs/methods.md
// §4.4, EC-1 and EC-2): with the sheaths open at one end they carry no current, so the ECC
// current is the loop EMF over the loop impedance, each piece of the run adding its own EMF.

const SOURCE = 'docs/methods.md §4.4 (EC): derived from Carson\'s simplified mutual impedance (§3.1) summed over the pieces of the run';
const F = 50;
const RHO = 100;
const I = 1000;
/** Cables a, b, c and the ECC (x, depth), m: the ECC 0.25 m beyond cable c; mirrored beyond a. */
const CABLES = [{ xM: -0.25, depthM: 1 }, { xM: 0, depthM: 1 }, { xM: 0.25, depthM: 1 }];
const ECC = { xM: 0.5, depthM: 1, rOhmPerKm: 0.0754, gmrMm: 8.6 };
const R_START = 1;
const R_END = 1;

function study(lengthsM: number[], ecc: { transposedAtMidpoint?: boolean; transposedAtJoints?: number[] }): BondingStudyInput {
  const ids = lengthsM.map((_, i) => `S${i + 1}`);
  return {
    kind: 'bonding', title: 'ECC crossings', frequencyHz: F, soilResistivityOhmM: RHO,
    cableTypes: [{ id: 'T', name: 'illustrative', conductorResistanceOhmPerKm: 0.03, conductorGmrMm: 14, sheathMeanDiameterMm: 90, sheathResistanceOhmPerKm: 0.1, oversheathThicknessMm: 4, overallDiameterMm: 100, oversheathWithstandKv: 20 }],
    circuits: [{ id: 'C1', name: 'circuit', cableTypeId: 'T' }],
    eccs: [{ id: 'E1', name: 'ECC', resistanceOhmPerKm: ECC.rOhmPerKm, gmrMm: ECC.gmrMm, fromSectionId: ids[0], toSectionId: ids[ids.length - 1], ...ecc }],
    layouts: [{ id: 'L', circuits: [{ circuitId: 'C1', formation: 'coordinates', positions: CABLES }], eccs: [{ eccId: 'E1', xM: ECC.xM, depthM: ECC.depthM }] }],
    sections: lengthsM.map((lengthM, i) => ({ id: ids[i], lengthM, layoutId: 'L' })),
    bonding: [{ kind: 'single-point', sectionIds: ids, earthedAt: 'end' }],
    earthing: { routeStartOhm: R_START, routeEndOhm: R_END, linkBoxOhm: 10 },
    cases: [{ id: 'N', name: 'load', kind: 'normal', currents: [{ circuitId: 'C1', currentA: I }] }],
  };
}

const eccCurrentA = (input: BondingStudyInput) => calculateBondingStudy(bondingStudySchema.parse(input)).cases[0].eccCurrents[0].maxA;

/**
 * The closed form, computed with mathjs complex numbers: EMF per metre on the ECC at x from
 * balanced currents, E = jω·2e-7·Σ I_k·ln(1/d_k) (the earth-return terms cancel for Σ I_k = 0);
 * loop impedance Z = (R_e + π²f·1e-7 + jω·2e-7·ln(De/GMR_e))·L + R_start + R_end, with
 * De = 658.5·√(ρ/f). `pieces` gives each piece's length and whether the ECC is mirrored there.
 */
function closedFormEccCurrentA(pieces: Array<{ lengthM: number; mirrored: boolean }>): number {
  const w = 2 * Math.PI * F;
  const phasors = [0, -120, 120].map((deg) => complex({ r: I, phi: (deg * Math.PI) / 180 }));
  const emfPerM = (x: number) => {
    let sum: MathComplex = complex(0, 0);
    CABLES.forEach((c, k) => {
      const d = Math.hypot(c.xM - x, c.depthM - ECC.depthM);
      sum = add(sum, multiply(phasors[k], complex(0, w * 2e-7 * Math.log(1 / d)))) as MathComplex;
    });
    return sum;
  };
  let emf: MathComplex = complex(0, 0);
  let lengthM = 0;
  for (const p of pieces) {
    emf = add(emf, multiply(emfPerM(p.mirrored ? -ECC.xM : ECC.xM), p.lengthM)) as MathComplex;
    lengthM += p.lengthM;
  }
  const de = 658.5 * Math.sqrt(RHO / F);
  const zPerM = complex(ECC.rOhmPerKm / 1000 + Math.PI ** 2 * F * 1e-7, w * 2e-7 * Math.log(de / (ECC.gmrMm / 1000)));
  const loop = add(multiply(zPerM, lengthM), R_START + R_END) as MathComplex;
  return abs(divide(emf, loop) as MathComplex) as unknown as number;
}

describe('ECC transposition points (docs/methods.md §4.4)', () => {
  it('EC-1: 3 × 300 m run crossed at joints 1 and 2 (the thirds): I_ECC = 8.9039 A [derived: closed form]', ({ task }) => {
    const check = referenceValues(task, 'EC-1', SOURCE);
    const expected = closedFormEccCurrentA([{ lengthM: 300, mirrored: false }, { lengthM: 300, mirrored: true }, { lengthM: 300, mirrored: false }]);
    check('closed-form I_ECC', expected, 8.9039, 'A', decimals(4));
    check('I_ECC', eccCurrentA(study([300, 300, 300], { transposedAtJoints: [1, 2] })), expected, 'A', relative(1e-6));
  });

  it('EC-2: the same run not crossed: I_ECC = 24.603 A; crossed at the middle: 3.6778 A [derived: closed form]', ({ task }) => {
    const check = referenceValues(task, 'EC-2', SOURCE);
    const straight = closedFormEccCurrentA([{ lengthM: 900, mirrored: false }]);
    const middle = closedFormEccCurrentA([{ lengthM: 450, mirrored: false }, { lengthM: 450, mirrored: true }]);
    check('closed-form I_ECC, not crossed', straight, 24.603, 'A', decimals(3));
    check('closed-form I_ECC, crossed at the middle', middle, 3.6778, 'A', decimals(4));
    check('I_ECC, not crossed', eccCurrentA(study([300, 300, 300], {})), straight, 'A', relative(1e-6));
    // The old flag puts the crossing at the run's middle chainage, inside section S2.
    check('I_ECC, transposedAtMidpoint', eccCurrentA(study([300, 300, 300], { transposedAtMidpoint: true })), middle, 'A', relative(1e-6));
  });

  it('a crossing at the middle joint gives exactly the result of the old "transposed at the midpoint" flag', () => {
    const viaFlag = calculateBondingStudy(bondingStudySchema.parse(study([450, 450], { transposedAtMidpoint: true })));
    const viaJoints = calculateBondingStudy(bondingStudySchema.parse(study([450, 450], { transposedAtJoints: [1] })));
    expect(viaJoints).toEqual(viaFlag);
    expect(viaJoints.cases[0].eccCurrents[0].maxA).toBeGreaterThan(0);
  });

  it('crossing twice at the same pair of points is undone: joints in any order give the same result', () => {
    const a = eccCurrentA(study([200, 300, 250, 250], { transposedAtJoints: [3, 1] }));
    const b = eccCurrentA(study([200, 300, 250, 250], { transposedAtJoints: [1, 3] }));
    expect(a).toBe(b);
    const pieces = [{ lengthM: 200, mirrored: false }, { lengthM: 550, mirrored: true }, { lengthM: 250, mirrored: false }];
    expect(a).toBeCloseTo(closedFormEccCurrentA(pieces), 6);
  });

  it('refuses, by field, a joint outside the run, a joint named twice, and both ways at once', () => {
    const issues = (ecc: object) => {
      const r = bondingStudySchema.safeParse(study([300, 300, 300], ecc));
      return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    };
    expect(issues({ transposedAtJoints: [3] })).toEqual([{ path: 'eccs.0.transposedAtJoints.0', message: expect.stringContaining('not inside the run of ECC "E1" (joints 1 to 2)') }]);
    expect(issues({ transposedAtJoints: [0] })[0].path).toBe('eccs.0.transposedAtJoints.0');
    expect(issues({ transposedAtJoints: [1, 1] })).toEqual([{ path: 'eccs.0.transposedAtJoints.1', message: expect.stringContaining('named twice') }]);
    expect(issues({ transposedAtJoints: [1], transposedAtMidpoint: true })).toEqual([{ path: 'eccs.0.transposedAtJoints', message: expect.stringContaining('not both') }]);
    expect(issues({ transposedAtJoints: [1.5] })[0]).toMatchObject({ path: 'eccs.0.transposedAtJoints.0', message: expect.stringContaining('whole joint number') });
    expect(issues({ transposedAtJoints: [2] })).toEqual([]);
  });

  it('a study without the new field parses to the same object as before (stored inputs keep their hash)', () => {
    const input = study([300, 300, 300], { transposedAtMidpoint: true });
    const parsed = bondingStudySchema.parse(input);
    expect('transposedAtJoints' in parsed.eccs[0]).toBe(false);
    expect(parsed.bondingLeadMilliohm).toEqual({ r: 0, x: 0 });
    expect(checkBondingStudy(parsed)).toEqual([]);
    expect(bondingStudySchema.parse(parsed)).toEqual(parsed);
  });
});

describe('an ECC set to cross "at joints I choose" with no joint ticked', () => {
  // The study form stores the choice as a list of joints; on a one-section run there is no joint
  // inside the run to tick, so the list comes empty. It crosses nowhere, and says so everywhere.
  it('on a one-section run is stored as not transposed, worded "none", and calculates as not transposed', () => {
    const ticked = bondingStudySchema.parse(study([900], { transposedAtJoints: [] }));
    const plain = bondingStudySchema.parse(study([900], {}));
    expect('transposedAtJoints' in ticked.eccs[0] && ticked.eccs[0].transposedAtJoints !== undefined).toBe(false);
    expect(JSON.parse(JSON.stringify(ticked))).toEqual(JSON.parse(JSON.stringify(plain)));
    expect(eccCrossingsText(ticked, ticked.eccs[0])).toBe('none');
    expect(calculateBondingStudy(ticked)).toEqual(calculateBondingStudy(plain));
    // Not transposed over 900 m: the closed form of EC-2 [derived: closed form, as above].
    expect(eccCurrentA(study([900], { transposedAtJoints: [] }))).toBeCloseTo(closedFormEccCurrentA([{ lengthM: 900, mirrored: false }]), 6);
  });

  it('a ticked joint still crosses there', () => {
    expect(bondingStudySchema.parse(study([450, 450], { transposedAtJoints: [1] })).eccs[0].transposedAtJoints).toEqual([1]);
  });
});
