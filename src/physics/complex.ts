/**
 * A small immutable complex-number helper for the phasor circuit and the Bessel functions.
 * Not used in hot loops (those work on Float64Arrays); clarity wins over allocation here.
 */
export interface Complex {
  readonly re: number;
  readonly im: number;
}

/** Build re + j im. */
export const cx = (re: number, im = 0): Complex => ({ re, im });

export const ZERO: Complex = cx(0, 0);
export const ONE: Complex = cx(1, 0);
/** The imaginary unit j. */
export const J: Complex = cx(0, 1);

export const add = (a: Complex, b: Complex): Complex => cx(a.re + b.re, a.im + b.im);
export const sub = (a: Complex, b: Complex): Complex => cx(a.re - b.re, a.im - b.im);
export const mul = (a: Complex, b: Complex): Complex =>
  cx(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
export const scale = (a: Complex, s: number): Complex => cx(a.re * s, a.im * s);
export const neg = (a: Complex): Complex => cx(-a.re, -a.im);
export const conj = (a: Complex): Complex => cx(a.re, -a.im);

/** Division by Smith's algorithm (R. L. Smith, CACM 5(8), 1962), which avoids overflow. */
export function div(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return cx((a.re + a.im * r) / d, (a.im - a.re * r) / d);
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return cx((a.re * r + a.im) / d, (a.im * r - a.re) / d);
}

export const inv = (a: Complex): Complex => div(ONE, a);
export const abs = (a: Complex): number => Math.hypot(a.re, a.im);
export const abs2 = (a: Complex): number => a.re * a.re + a.im * a.im;

/** e^z = e^re (cos im + j sin im). */
export const exp = (z: Complex): Complex => {
  const m = Math.exp(z.re);
  return cx(m * Math.cos(z.im), m * Math.sin(z.im));
};

/** Parallel combination a b / (a + b) of two impedances [ohm]. */
export const parallel = (a: Complex, b: Complex): Complex => div(mul(a, b), add(a, b));
