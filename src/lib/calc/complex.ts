/** A complex number (r.m.s. phasor or impedance). Plain data so results serialise as JSON. */
export interface Complex {
  re: number;
  im: number;
}

export const ZERO: Complex = { re: 0, im: 0 };

export const complex = (re: number, im = 0): Complex => ({ re, im });

export const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });

export const sub = (a: Complex, b: Complex): Complex => ({ re: a.re - b.re, im: a.im - b.im });

export const mul = (a: Complex, b: Complex): Complex => ({
  re: a.re * b.re - a.im * b.im,
  im: a.re * b.im + a.im * b.re,
});

export const scale = (a: Complex, k: number): Complex => ({ re: a.re * k, im: a.im * k });

export function div(a: Complex, b: Complex): Complex {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}

export const abs = (a: Complex): number => Math.hypot(a.re, a.im);

/** Angle in degrees, (−180, 180]. */
export const argDeg = (a: Complex): number => (Math.atan2(a.im, a.re) * 180) / Math.PI;

export const polar = (magnitude: number, angleDeg: number): Complex => {
  const t = (angleDeg * Math.PI) / 180;
  return { re: magnitude * Math.cos(t), im: magnitude * Math.sin(t) };
};
