/**
 * Minimal complex arithmetic for the closed-form models. Plain objects keep the formulas
 * readable; the hot fitting paths (Cole–Cole, CPE, ZARC) use scalar arithmetic instead.
 */
export interface Complex {
  readonly re: number;
  readonly im: number;
}

export const complex = (re: number, im = 0): Complex => ({ re, im });

export const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });

export const mul = (a: Complex, b: Complex): Complex => ({
  re: a.re * b.re - a.im * b.im,
  im: a.re * b.im + a.im * b.re,
});

export const scale = (a: Complex, k: number): Complex => ({ re: a.re * k, im: a.im * k });

export function div(a: Complex, b: Complex): Complex {
  // Smith's algorithm: avoids overflow when |b| is very large or very small.
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

export const inverse = (a: Complex): Complex => div({ re: 1, im: 0 }, a);

/** (jx)^p for real x ≥ 0 and real p: x^p·e^{jpπ/2}. */
export function jPower(x: number, p: number): Complex {
  const m = Math.pow(x, p);
  const a = (p * Math.PI) / 2;
  return { re: m * Math.cos(a), im: m * Math.sin(a) };
}

/** Principal power a^p for real p, in polar form. */
export function realPower(a: Complex, p: number): Complex {
  const m = Math.pow(Math.hypot(a.re, a.im), p);
  const t = Math.atan2(a.im, a.re) * p;
  return { re: m * Math.cos(t), im: m * Math.sin(t) };
}

/**
 * tanh of a complex number in a form that never overflows: for |Re z| > 20 the result equals
 * ±1 to double precision, so large arguments (long diffusion times) stay finite.
 */
export function tanh(z: Complex): Complex {
  if (z.re > 20) return { re: 1, im: 0 };
  if (z.re < -20) return { re: -1, im: 0 };
  const d = Math.cosh(2 * z.re) + Math.cos(2 * z.im);
  return { re: Math.sinh(2 * z.re) / d, im: Math.sin(2 * z.im) / d };
}
