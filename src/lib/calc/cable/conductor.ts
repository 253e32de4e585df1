import type { ConductorMetal } from './materials';

export const strandings = ['solid', 'stranded', 'compacted', 'segmental'] as const;
export type Stranding = (typeof strandings)[number];

/**
 * GMR of a round conductor as a fraction of its outer radius. Solid: e^(−1/4) = 0.7788, from a
 * round wire's internal inductance μ0/8π (any power-system text, e.g. Grainger & Stevenson,
 * Power System Analysis, §4.4). Concentric-lay stranding of equal round wires: the classic
 * table (Westinghouse Electrical Transmission and Distribution Reference Book, 4th ed., ch. 3;
 * from memory), which tests/unit/calc/cable-conductor.test.ts rebuilds from the strand geometry.
 */
export const SOLID_GMR_FACTOR = Math.exp(-0.25);
export const STRANDED_GMR_FACTORS: Readonly<Record<number, number>> = { 7: 0.7256, 19: 0.7577, 37: 0.7678, 61: 0.7722, 91: 0.7743, 127: 0.7755 };
export const strandCounts = Object.keys(STRANDED_GMR_FACTORS).map(Number);

export interface GmrFactor {
  factor: number;
  source: string;
}

/**
 * The GMR factor for a stranding. Compacted and segmental (Milliken) conductors fill their
 * circle almost fully and carry nearly uniform current at power frequency, so they take the
 * solid factor (common practice, from memory); a maker's GMR, where given, is better.
 */
export function gmrFactor(stranding: Stranding, strandCount?: number): GmrFactor {
  if (stranding === 'stranded') {
    const factor = STRANDED_GMR_FACTORS[strandCount ?? 0];
    if (factor === undefined) throw new Error(`no GMR factor for ${strandCount} strands`);
    return { factor, source: `${strandCount} equal round strands, concentric lay: Westinghouse T&D Reference Book, ch. 3 (from memory; rebuilt from strand geometry in our tests)` };
  }
  if (stranding === 'solid') return { factor: SOLID_GMR_FACTOR, source: 'solid round wire, e^(−1/4) from its internal inductance μ0/8π (Grainger & Stevenson, Power System Analysis, §4.4)' };
  return { factor: SOLID_GMR_FACTOR, source: `${stranding === 'compacted' ? 'compacted stranded' : 'segmental (Milliken)'} conductor taken as a filled round conductor, e^(−1/4) (common practice, from memory; prefer the maker's GMR)` };
}

/**
 * Skin-effect factor ks, IEC 60287-1-1:2006+A1:2014, Table 2 (from memory): 1 for solid and
 * stranded round conductors; for segmental (Milliken) conductors 0.435 in copper, and in
 * aluminium 0.28, 0.19 or 0.12 for 4, 5 or 6 segments.
 */
export function skinEffectKs(material: ConductorMetal, stranding: Stranding, segmentCount?: number): number {
  if (stranding !== 'segmental') return 1;
  if (material === 'copper') return 0.435;
  const ks = ({ 4: 0.28, 5: 0.19, 6: 0.12 } as Record<number, number>)[segmentCount ?? 0];
  if (ks === undefined) throw new Error(`no ks for ${segmentCount} aluminium segments`);
  return ks;
}

/** xs² = 8πf/R'·10⁻⁷·ks with R' in Ω/m, IEC 60287-1-1 §2.1.2. */
export const skinEffectArgumentSquared = (frequencyHz: number, resistanceOhmPerM: number, ks: number): number => ((8 * Math.PI * frequencyHz) / resistanceOhmPerM) * 1e-7 * ks;

/** The skin-effect factor ys from xs, IEC 60287-1-1 §2.1.2 (its three ranges of xs). */
export function skinEffectFactor(xs: number): number {
  if (xs <= 2.8) return xs ** 4 / (192 + 0.8 * xs ** 4);
  if (xs <= 3.8) return -0.136 - 0.0177 * xs + 0.0563 * xs ** 2;
  return 0.354 * xs - 0.733;
}
