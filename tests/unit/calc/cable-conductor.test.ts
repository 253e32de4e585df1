import { describe, expect, it } from 'vitest';
import { gmrFactor, SOLID_GMR_FACTOR, STRANDED_GMR_FACTORS, skinEffectKs, skinEffectFactor } from '../../../src/lib/calc/cable/conductor';
import { CONDUCTOR_METALS, SHEATH_METALS, atTemperature, resistanceOhmPerKm } from '../../../src/lib/calc/cable/materials';
import { deriveCableParameters } from '../../../src/lib/calc/cable/derive-cable';
import { cableConstructionSchema } from '../../../src/lib/schemas/bonding-study.schema';

// Conductor figures of a cable construction against outside references.

describe('resistivities and temperature coefficients (IEC 60287-1-1 Table 1)', () => {
  it('copper is the International Annealed Copper Standard: 1/58 Ω·mm²/m and α20 = 0.00393 /K', () => {
    // IEC 60028 (International standard of resistance for copper), from memory.
    expect(CONDUCTOR_METALS.copper.resistivity20OhmM).toBeCloseTo(1e-6 / 58, 12);
    expect(CONDUCTOR_METALS.copper.alpha20PerK).toBe(0.00393);
    expect(SHEATH_METALS.copper.resistivity20OhmM).toBe(CONDUCTOR_METALS.copper.resistivity20OhmM);
  });

  it('conductor aluminium is 61 % IACS, the hard-drawn aluminium of IEC 60889, α20 = 0.00403 /K', () => {
    // IEC 60889 (hard-drawn aluminium wire): 61.0 % IACS, from memory.
    // Table 1 gives five figures: 2.8264e-8 against 2.82646e-8.
    expect(Math.abs(CONDUCTOR_METALS.aluminium.resistivity20OhmM / (1e-6 / 58 / 0.61) - 1)).toBeLessThan(1e-4);
    expect(CONDUCTOR_METALS.aluminium.alpha20PerK).toBe(0.00403);
  });

  it('a sheath metal conducts worse than copper, in the order lead > stainless > steel > bronze > aluminium (Table 1, from memory)', () => {
    const rho = (m: keyof typeof SHEATH_METALS) => SHEATH_METALS[m].resistivity20OhmM;
    expect(rho('stainless-steel')).toBeGreaterThan(rho('lead'));
    expect(rho('lead')).toBeGreaterThan(rho('steel'));
    expect(rho('steel')).toBeGreaterThan(rho('bronze'));
    expect(rho('bronze')).toBeGreaterThan(rho('aluminium'));
    expect(rho('aluminium')).toBeGreaterThan(rho('copper'));
  });

  it('R(θ) = R20·[1 + α20·(θ − 20)] (IEC 60287-1-1 eq. (2)): copper at 90 °C is 1.2751 × R20', () => {
    // Hand calculation: 1 + 0.00393 × 70 = 1.2751.
    expect(atTemperature(0.0176, 0.00393, 90)).toBeCloseTo(0.0176 * 1.2751, 12);
    expect(atTemperature(0.0176, 0.00393, 20)).toBe(0.0176);
  });
});

describe('d.c. resistance at 20 °C against IEC 60228 (Table 2, class 2 stranded conductors; maxima from memory)', () => {
  // ρ20/A is the metal of the nominal area alone; IEC 60228's maxima add allowances for lay and
  // area tolerance, so each maximum lies a little above ρ20/A, never below.
  const table: Array<[keyof typeof CONDUCTOR_METALS, number, number]> = [
    ['copper', 240, 0.0754],
    ['copper', 630, 0.0283],
    ['copper', 1000, 0.0176],
    ['aluminium', 400, 0.0778],
    ['aluminium', 630, 0.0469],
    ['aluminium', 1000, 0.0291],
  ];
  for (const [material, areaMm2, maxOhmPerKm] of table) {
    it(`${areaMm2} mm² ${material}: ρ20/A lies 0–12 % under the IEC 60228 maximum ${maxOhmPerKm} Ω/km`, () => {
      const r = resistanceOhmPerKm(CONDUCTOR_METALS[material].resistivity20OhmM, areaMm2);
      expect(r).toBeLessThan(maxOhmPerKm);
      expect(maxOhmPerKm / r).toBeLessThan(1.12);
    });
  }
});

describe('geometric mean radius factors', () => {
  // Independent reference: the GMR of n equal round strands (own GMR e^(−1/4)·r each) in
  // concentric layers of 6k strands on radius 2k·r, from the definition
  // ln GMR = (1/n²)·Σᵢ Σⱼ ln Dᵢⱼ (any power-system text, e.g. Grainger & Stevenson §4.7).
  function strandGeometryFactor(layers: number): { strands: number; factor: number } {
    const pts: Array<[number, number]> = [[0, 0]];
    for (let k = 1; k <= layers; k++) for (let i = 0; i < 6 * k; i++) pts.push([2 * k * Math.cos((2 * Math.PI * i) / (6 * k)), 2 * k * Math.sin((2 * Math.PI * i) / (6 * k))]);
    let sum = 0;
    for (const a of pts) for (const b of pts) sum += a === b ? -0.25 : Math.log(Math.hypot(a[0] - b[0], a[1] - b[1]));
    return { strands: pts.length, factor: Math.exp(sum / pts.length ** 2) / (2 * layers + 1) };
  }

  it('solid round: e^(−1/4) = 0.7788 (Grainger & Stevenson, Power System Analysis, §4.4)', () => {
    expect(SOLID_GMR_FACTOR).toBeCloseTo(0.7788, 4);
    expect(gmrFactor('solid').factor).toBe(SOLID_GMR_FACTOR);
  });

  for (let layers = 1; layers <= 5; layers++) {
    const { strands, factor } = strandGeometryFactor(layers);
    it(`${strands} strands: the handbook factor ${STRANDED_GMR_FACTORS[strands]} equals the strand geometry (${factor.toFixed(5)})`, () => {
      // Within the handbook's four-figure rounding (its layers may sit on slightly different radii).
      expect(Math.abs(gmrFactor('stranded', strands).factor - factor)).toBeLessThan(2e-4);
    });
  }

  it('more strands approach the solid factor from below', () => {
    const f = Object.values(STRANDED_GMR_FACTORS);
    for (let i = 1; i < f.length; i++) expect(f[i]).toBeGreaterThan(f[i - 1]);
    expect(f[f.length - 1]).toBeLessThan(SOLID_GMR_FACTOR);
  });
});

describe('skin effect (IEC 60287-1-1 §2.1.2) against the exact solution for a solid round conductor', () => {
  // Exact: R_ac/R_dc = Re[(q/2)·J0(q)/J1(q)] with q = x·(1 − j)/√2, x = √2·a/δ, the Bessel
  // solution for a round wire (Ramo, Whinnery & Van Duzer, Fields and Waves in Communication
  // Electronics, §5.x, from memory). IEC's xs equals this x when ks = 1: xs² = 8πf·10⁻⁷/R'
  // = ωμ0σa². Complex Bessel functions by their power series, written out here.
  type C = [number, number];
  const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
  const div = (a: C, b: C): C => { const d = b[0] ** 2 + b[1] ** 2; return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d]; };
  const bessel = (n: 0 | 1, z: C): C => {
    let term: C = n === 0 ? [1, 0] : [z[0] / 2, z[1] / 2];
    let sum = term;
    const z2 = mul(z, z);
    for (let k = 1; k < 80; k++) { term = mul(term, [-z2[0] / (4 * k * (k + n)), -z2[1] / (4 * k * (k + n))]); sum = [sum[0] + term[0], sum[1] + term[1]]; }
    return sum;
  };
  const exactRatio = (x: number): number => { const q: C = [x / Math.SQRT2, -x / Math.SQRT2]; return mul([q[0] / 2, q[1] / 2], div(bessel(0, q), bessel(1, q)))[0]; };

  for (const xs of [0.5, 1, 2, 2.5, 2.8, 3.3, 4, 5]) {
    it(`xs = ${xs}: 1 + ys within 0.5 % of the exact ratio`, () => {
      expect(Math.abs((1 + skinEffectFactor(xs)) / exactRatio(xs) - 1)).toBeLessThan(0.005);
    });
  }

  it('a 1000 mm² solid-copper rod derives the ratio the Bessel solution gives for its radius and resistivity', () => {
    const c = cableConstructionSchema.parse({
      conductor: { material: 'copper', crossSectionMm2: 1000, diameterMm: 35.68, stranding: 'solid', operatingTemperatureC: 20 },
      screen: { kind: 'tubular', material: 'lead', meanDiameterMm: 80, thicknessMm: 2.5, operatingTemperatureC: 20 },
    });
    const d = deriveCableParameters(c);
    // x = √(ωμ0σ)·a with σ = 1/ρ20 and a from the area (hand calculation).
    const x = Math.sqrt((2 * Math.PI * 50 * 4e-7 * Math.PI) / 1.7241e-8) * Math.sqrt(1000e-6 / Math.PI);
    const rdc = (1.7241e-8 / 1000e-6) * 1000;
    expect(d.conductorResistanceOhmPerKm / rdc).toBeCloseTo(exactRatio(x), 2);
    expect(d.figures.find((f) => f.key === 'conductorXs')!.value).toBeCloseTo(x, 10);
  });

  it('Milliken segments cut the skin effect: ks from Table 2 (from memory)', () => {
    expect(skinEffectKs('copper', 'segmental', 5)).toBe(0.435);
    expect(skinEffectKs('aluminium', 'segmental', 4)).toBe(0.28);
    expect(skinEffectKs('aluminium', 'segmental', 6)).toBe(0.12);
    expect(skinEffectKs('copper', 'stranded')).toBe(1);
  });

  it('1000 mm² copper Milliken at 90 °C, 50 Hz from the IEC 60228 maximum: hand calculation', () => {
    const c = cableConstructionSchema.parse({
      conductor: { material: 'copper', crossSectionMm2: 1000, diameterMm: 38.5, stranding: 'segmental', segmentCount: 5, resistance20OhmPerKm: 0.0176, operatingTemperatureC: 90 },
      screen: { kind: 'tubular', material: 'lead', meanDiameterMm: 90, thicknessMm: 2.8, operatingTemperatureC: 70 },
    });
    // R' = 0.0176 × 1.2751 = 0.02244176 Ω/km; xs² = 8π·50·1e-7·0.435 / 2.244176e-5
    // = 5.466371e-5 / 2.244176e-5 = 2.43580; ys = xs⁴/(192 + 0.8·xs⁴) = 5.93314/196.7465
    // = 0.030156; R = R'·1.030156.
    const rPrime = 0.0176 * 1.2751;
    const xs2 = (8 * Math.PI * 50 * 1e-7 * 0.435) / (rPrime / 1000);
    expect(xs2).toBeCloseTo(2.4358, 4);
    const ys = xs2 ** 2 / (192 + 0.8 * xs2 ** 2);
    expect(ys).toBeCloseTo(0.030156, 5);
    const d = deriveCableParameters(c);
    expect(d.conductorResistanceOhmPerKm).toBeCloseTo(rPrime * (1 + ys), 12);
    expect(d.conductorGmrMm).toBeCloseTo((Math.exp(-0.25) * 38.5) / 2, 12);
  });
});
