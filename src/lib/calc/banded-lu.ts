/**
 * LU factorisation and solution of a complex banded matrix without pivoting. Suitable for
 * nodal admittance matrices of passive networks, whose real part is positive definite once
 * every node has a path to earth; a vanishing pivot is reported, never divided by.
 * Storage: row i holds columns i−bw … i+bw at offset i·(2bw+1) + (j − i + bw).
 */
export class BandedMatrix {
  readonly width: number;
  readonly re: Float64Array;
  readonly im: Float64Array;

  constructor(
    readonly size: number,
    readonly bandwidth: number,
  ) {
    this.width = 2 * bandwidth + 1;
    this.re = new Float64Array(size * this.width);
    this.im = new Float64Array(size * this.width);
  }

  add(row: number, col: number, re: number, im: number): void {
    const k = row * this.width + col - row + this.bandwidth;
    this.re[k] += re;
    this.im[k] += im;
  }

  get(row: number, col: number): { re: number; im: number } {
    if (Math.abs(row - col) > this.bandwidth) return { re: 0, im: 0 };
    const k = row * this.width + col - row + this.bandwidth;
    return { re: this.re[k], im: this.im[k] };
  }

  clone(): BandedMatrix {
    const c = new BandedMatrix(this.size, this.bandwidth);
    c.re.set(this.re);
    c.im.set(this.im);
    return c;
  }
}

export class IllConditionedError extends Error {
  constructor(readonly row: number) {
    super(`the network equations are singular or ill-conditioned at unknown ${row}`);
  }
}

/** Factorises in place (L below the diagonal with unit diagonal, U on and above). */
export function factorBanded(a: BandedMatrix): BandedMatrix {
  const { size: n, bandwidth: bw, width: w, re, im } = a;
  let scale = 0;
  for (let i = 0; i < n; i++) scale = Math.max(scale, Math.hypot(re[i * w + bw], im[i * w + bw]));
  const tiny = scale * 1e-13;
  for (let k = 0; k < n; k++) {
    const dk = k * w + bw;
    const pr = re[dk];
    const pi = im[dk];
    const pm = pr * pr + pi * pi;
    if (!(Math.sqrt(pm) > tiny)) throw new IllConditionedError(k);
    const last = Math.min(n - 1, k + bw);
    for (let i = k + 1; i <= last; i++) {
      const ik = i * w + k - i + bw;
      const ar = re[ik];
      const ai = im[ik];
      if (ar === 0 && ai === 0) continue;
      const lr = (ar * pr + ai * pi) / pm;
      const li = (ai * pr - ar * pi) / pm;
      re[ik] = lr;
      im[ik] = li;
      const rowI = i * w - i + bw;
      const rowK = k * w - k + bw;
      for (let j = k + 1; j <= last; j++) {
        const ur = re[rowK + j];
        const ui = im[rowK + j];
        re[rowI + j] -= lr * ur - li * ui;
        im[rowI + j] -= lr * ui + li * ur;
      }
    }
  }
  return a;
}

/** Solves LU·x = b for one right-hand side (b given as separate real and imaginary arrays, overwritten with x). */
export function solveFactored(lu: BandedMatrix, bRe: Float64Array, bIm: Float64Array): void {
  const { size: n, bandwidth: bw, width: w, re, im } = lu;
  for (let i = 0; i < n; i++) {
    const row = i * w - i + bw;
    let sr = bRe[i];
    let si = bIm[i];
    for (let k = Math.max(0, i - bw); k < i; k++) {
      const lr = re[row + k];
      const li = im[row + k];
      sr -= lr * bRe[k] - li * bIm[k];
      si -= lr * bIm[k] + li * bRe[k];
    }
    bRe[i] = sr;
    bIm[i] = si;
  }
  for (let i = n - 1; i >= 0; i--) {
    const row = i * w - i + bw;
    let sr = bRe[i];
    let si = bIm[i];
    const last = Math.min(n - 1, i + bw);
    for (let j = i + 1; j <= last; j++) {
      const ur = re[row + j];
      const ui = im[row + j];
      sr -= ur * bRe[j] - ui * bIm[j];
      si -= ur * bIm[j] + ui * bRe[j];
    }
    const dr = re[row + i];
    const di = im[row + i];
    const dm = dr * dr + di * di;
    bRe[i] = (sr * dr + si * di) / dm;
    bIm[i] = (si * dr - sr * di) / dm;
  }
}
