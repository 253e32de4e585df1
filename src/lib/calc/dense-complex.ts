import { type Complex, ZERO, add, div, mul, sub } from './complex';

/** Inverse of a small dense complex matrix by Gauss–Jordan elimination with partial pivoting. */
export function invertComplex(m: Complex[][]): Complex[][] {
  const n = m.length;
  const a = m.map((row, i) => [...row, ...row.map((_, j) => (i === j ? { re: 1, im: 0 } : ZERO))]);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (magnitude(a[r][col]) > magnitude(a[pivot][col])) pivot = r;
    if (magnitude(a[pivot][col]) === 0) throw new Error('singular impedance matrix');
    [a[col], a[pivot]] = [a[pivot], a[col]];
    const p = a[col][col];
    a[col] = a[col].map((v) => div(v, p));
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const f = a[r][col];
      if (f.re === 0 && f.im === 0) continue;
      a[r] = a[r].map((v, c) => sub(v, mul(f, a[col][c])));
    }
  }
  return a.map((row) => row.slice(n));
}

/** Product of dense complex matrices (n×k)·(k×m). */
export function multiplyComplex(a: Complex[][], b: Complex[][]): Complex[][] {
  return a.map((row) => b[0].map((_, c) => row.reduce((s, v, k) => add(s, mul(v, b[k][c])), ZERO)));
}

const magnitude = (z: Complex) => Math.hypot(z.re, z.im);
