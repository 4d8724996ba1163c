/**
 * The ratio (z/2) J0(z) / J1(z) for complex z, the round-wire impedance function of skin-effect theory.
 * Small |z|: the ascending series J_n(z) = (z/2)^n sum_k (-z^2/4)^k / (k! (n+k)!) (DLMF 10.2.2).
 * Large |z|: Hankel's asymptotic expansion J_nu(z) = sqrt(2/(pi z)) (P cos w - Q sin w), w = z - nu pi/2 - pi/4
 * (DLMF 10.17.3; Abramowitz & Stegun 9.2.5, 9.2.9-9.2.10), with e^{iw} factored out so nothing overflows
 * when Im z is large; the other exponential is kept, not dropped.
 */
import { add, cx, div, exp, mul, scale, sub, type Complex } from './complex';

/** Above this |z| the asymptotic expansion is used: its smallest term is about e^(-2|z|) < 1e-15. */
export const ASYMPTOTIC_SWITCH = 18;
/** Series and asymptotic sums stop when a term is below this relative size (a few ulps). */
const TERM_TOLERANCE = 1e-17;
/** Safety cap on terms. */
const MAX_TERMS = 500;

/** Ascending series: returns (z/2) J0 / J1 = S0 / S1 with S_n = sum_k w^k / (k! (n+k)!), w = -z^2/4. */
export function seriesRatio(z: Complex): Complex {
  const w = scale(mul(z, z), -0.25);
  let t0 = cx(1);
  let t1 = cx(1);
  let s0 = t0;
  let s1 = t1;
  for (let k = 1; k < MAX_TERMS; k++) {
    t0 = scale(mul(t0, w), 1 / (k * k));
    t1 = scale(mul(t1, w), 1 / (k * (k + 1)));
    s0 = add(s0, t0);
    s1 = add(s1, t1);
    const small = Math.hypot(t0.re, t0.im) < TERM_TOLERANCE * Math.hypot(s0.re, s0.im);
    if (small && Math.hypot(t1.re, t1.im) < TERM_TOLERANCE * Math.hypot(s1.re, s1.im) && k * k > Math.hypot(w.re, w.im)) break;
  }
  return div(s0, s1);
}

/** Hankel's P + iQ and P - iQ for order nu (A&S 9.2.9-9.2.10), summed until the terms stop shrinking. */
function hankelPQ(nu: number, z: Complex): { plus: Complex; minus: Complex } {
  const mu = 4 * nu * nu;
  const invZ = div(cx(1), z);
  let p = cx(1);
  let q = cx(0);
  let term = cx(1); // a_k / z^k
  let lastSize = Infinity;
  for (let k = 1; k < MAX_TERMS; k++) {
    const next = scale(mul(term, invZ), (mu - (2 * k - 1) * (2 * k - 1)) / (8 * k));
    const size = Math.hypot(next.re, next.im);
    if (size > lastSize || size < TERM_TOLERANCE) break;
    lastSize = size;
    term = next;
    // even k -> P with sign (-1)^(k/2); odd k -> Q with sign (-1)^((k-1)/2)
    const sign = Math.floor(k / 2) % 2 === 0 ? 1 : -1;
    if (k % 2 === 0) p = add(p, scale(term, sign));
    else q = add(q, scale(term, sign));
  }
  const iq = mul(cx(0, 1), q);
  return { plus: add(p, iq), minus: sub(p, iq) };
}

/**
 * Asymptotic ratio: P cos w - Q sin w = (e^{iw}/2) [(P + iQ) + e^{-2iw} (P - iQ)], and
 * e^{i(w0 - w1)} = e^{i pi/2} = i, so J0/J1 = i [(P0+iQ0) + e^{-2iw0}(P0-iQ0)] / [(P1+iQ1) + e^{-2iw1}(P1-iQ1)].
 */
export function asymptoticRatio(z: Complex): Complex {
  const h0 = hankelPQ(0, z);
  const h1 = hankelPQ(1, z);
  const minus2iz = mul(cx(0, -2), z);
  const e0 = exp(add(minus2iz, cx(0, Math.PI / 2))); // e^{-2i(z - pi/4)}
  const e1 = exp(add(minus2iz, cx(0, (3 * Math.PI) / 2))); // e^{-2i(z - 3pi/4)}
  const num = add(h0.plus, mul(e0, h0.minus));
  const den = add(h1.plus, mul(e1, h1.minus));
  const j0OverJ1 = mul(cx(0, 1), div(num, den));
  return mul(scale(z, 0.5), j0OverJ1);
}

/** (z/2) J0(z) / J1(z) for complex z (series or Hankel expansion by |z|). */
export function halfZJ0OverJ1(z: Complex): Complex {
  return Math.hypot(z.re, z.im) <= ASYMPTOTIC_SWITCH ? seriesRatio(z) : asymptoticRatio(z);
}
