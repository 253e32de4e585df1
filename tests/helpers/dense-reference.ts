import { create, all, type Complex as MathComplex, type Matrix } from 'mathjs';
import type { CompiledNetwork } from '../../src/lib/calc/network';
import type { Complex } from '../../src/lib/calc/complex';

const math = create(all);

/** Solves a compiled network's assembled system densely with mathjs's complex LU (an independent solver). */
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
  return (x.toArray() as MathComplex[][]).map(([z]) => ({ re: z.re, im: z.im }));
}

export { math };
