import { create, all, type Complex as MathComplex, type Matrix } from 'mathjs';
import { EARTH, type CompiledNetwork, type NetworkBuilder } from '../../src/lib/calc/network';
import type { Complex } from '../../src/lib/calc/complex';

const math = create(all);

const toComplex = (z: MathComplex | number): Complex => (typeof z === 'number' ? { re: z, im: 0 } : { re: z.re, im: z.im });

/** Solves a compiled network's assembled system densely with mathjs's complex LU (same equations, another solver). */
export function solveWithMathjs(network: CompiledNetwork, sources: Complex[]): Complex[] {
  const n = network.size;
  const rows: MathComplex[][] = [];
  for (let i = 0; i < n; i++) {
    const row: MathComplex[] = [];
    for (let j = 0; j < n; j++) {
      const v = network.assembled.get(i, j);
      row.push(math.complex(v.re, v.im));
    }
    rows.push(row);
  }
  const rhs = network.rightHandSide(sources);
  const b = Array.from(rhs.re, (re, i) => [math.complex(re, rhs.im[i])]);
  const x = math.lusolve(math.matrix(rows), math.matrix(b)) as Matrix;
  return (x.toArray() as Array<[MathComplex | number]>).map(([z]) => toComplex(z));
}

export interface DenseSolution {
  /** Voltage of every node as added to the builder (no merging), to remote earth. */
  voltage: (node: number) => Complex;
  /** Conductor currents of each segment, from its `from` to its `to` nodes. */
  segmentCurrents: Complex[][];
}

/**
 * The same physical network rebuilt from the builder's raw elements and solved with mathjs,
 * independently of our assembly: modified nodal analysis with one unknown per node as added
 * (solid bonds are not merged but held by a zero-voltage constraint with its own current),
 * and each coupled segment written in impedance form, V_from − V_to = L·(Z_mm·I + Z_ms·I_s),
 * with Z_mm recovered by mathjs's inverse of the stored admittance. Branch currents come out
 * as unknowns, not from node voltages.
 */
export function solvePhysicalNetworkWithMathjs(builder: NetworkBuilder, activeTags: ReadonlySet<string>, sources: Complex[], segmentSources?: (k: number) => Complex[]): DenseSolution {
  const el = builder.elements(activeTags);
  const nNodes = el.nodeCount;
  const branchStart: number[] = [];
  let unknowns = nNodes;
  for (const seg of el.segments) {
    branchStart.push(unknowns);
    unknowns += seg.from.length;
  }
  const bondStart = unknowns;
  unknowns += el.bonds.length;

  const a: MathComplex[][] = Array.from({ length: unknowns }, () => Array.from({ length: unknowns }, () => math.complex(0, 0)));
  const rhs: MathComplex[] = Array.from({ length: unknowns }, () => math.complex(0, 0));
  const addA = (i: number, j: number, z: Complex) => {
    a[i][j] = math.add(a[i][j], math.complex(z.re, z.im)) as MathComplex;
  };
  const addRhs = (i: number, z: Complex) => {
    rhs[i] = math.add(rhs[i], math.complex(z.re, z.im)) as MathComplex;
  };

  // KCL rows 0..nNodes-1: currents leaving each node = injected currents.
  for (const y of el.admittances) {
    if (y.a !== EARTH) addA(y.a, y.a, y.admittanceS);
    if (y.b !== EARTH) addA(y.b, y.b, y.admittanceS);
    if (y.a !== EARTH && y.b !== EARTH) {
      addA(y.a, y.b, { re: -y.admittanceS.re, im: -y.admittanceS.im });
      addA(y.b, y.a, { re: -y.admittanceS.re, im: -y.admittanceS.im });
    }
  }
  for (const inj of el.injections) {
    if (inj.node === EARTH) continue;
    const s = sources[inj.sourceIndex];
    addRhs(inj.node, { re: inj.sign * s.re, im: inj.sign * s.im });
  }
  el.bonds.forEach(([p, q], k) => {
    const row = bondStart + k;
    addA(p, row, { re: 1, im: 0 });
    addA(q, row, { re: -1, im: 0 });
    addA(row, p, { re: 1, im: 0 });
    addA(row, q, { re: -1, im: 0 });
  });
  el.segments.forEach((seg, k) => {
    const zmm = math.inv(math.matrix(seg.coupling.zInv.map((r) => r.map((z) => math.complex(z.re, z.im))))) as Matrix;
    const zms = seg.coupling.sourceGain.length ? (math.multiply(zmm, math.matrix(seg.coupling.sourceGain.map((r) => r.map((z) => math.complex(z.re, z.im))))) as Matrix) : null;
    const zmmArr = zmm.toArray() as Array<Array<MathComplex | number>>;
    const zmsArr = zms ? (zms.toArray() as Array<Array<MathComplex | number>>) : [];
    seg.from.forEach((f, i) => {
      const branch = branchStart[k] + i;
      const t = seg.to[i];
      if (f !== EARTH) addA(f, branch, { re: 1, im: 0 });
      if (t !== EARTH) addA(t, branch, { re: -1, im: 0 });
      // Branch row: V_from − V_to − L·Σ Z_mm·I = L·Σ Z_ms·I_s.
      if (f !== EARTH) addA(branch, f, { re: 1, im: 0 });
      if (t !== EARTH) addA(branch, t, { re: -1, im: 0 });
      seg.from.forEach((_, j) => {
        const z = toComplex(zmmArr[i][j]);
        addA(branch, branchStart[k] + j, { re: -seg.lengthM * z.re, im: -seg.lengthM * z.im });
      });
      seg.coupling.sourceIndices.forEach((si, c) => {
        const z = toComplex(zmsArr[i][c]);
        const s = (segmentSources ? segmentSources(k) : sources)[si];
        addRhs(branch, { re: seg.lengthM * (z.re * s.re - z.im * s.im), im: seg.lengthM * (z.re * s.im + z.im * s.re) });
      });
    });
  });

  const x = (math.lusolve(math.matrix(a), math.matrix(rhs.map((z) => [z]))) as Matrix).toArray() as Array<[MathComplex | number]>;
  const values = x.map(([z]) => toComplex(z));
  return {
    voltage: (node) => (node === EARTH ? { re: 0, im: 0 } : values[node]),
    segmentCurrents: el.segments.map((seg, k) => seg.from.map((_, i) => values[branchStart[k] + i])),
  };
}

export { math };
