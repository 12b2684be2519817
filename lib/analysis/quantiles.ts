/**
 * Tail probabilities and quantiles of the standard normal distribution, for the significance rule
 * of the jet detector (docs/significance.md). The tail Q(z) = P(Z > z) = ½ erfc(z/√2) is evaluated
 * as ½ Γ(½, z²/2)/Γ(½): by its power series below z²/2 = 1.5 and by its continued fraction above
 * (Abramowitz & Stegun 6.5.29 and 6.5.31; the modified Lentz evaluation of Press et al., Numerical
 * Recipes, ch. 6), to ~1e-15 relative; the quantile inverts it by bisection to full precision.
 */

const TINY = 1e-300;
const EPS = 1e-16;
const LN_SQRT_PI = 0.5723649429247001; // ln Γ(½) = ln √π

/** The upper tail of the standard normal distribution, Q(z) = P(Z > z). */
export function normalUpperTail(z: number): number {
  if (Number.isNaN(z)) return NaN;
  if (z < 0) return 1 - normalUpperTail(-z);
  const x = (z * z) / 2;
  const front = Math.exp(-x + 0.5 * Math.log(x) - LN_SQRT_PI);
  if (x < 1.5) {
    // P(½, x) = e^{−x} x^{½}/Γ(½) · Σ_n x^n/(½·(3/2)···(½ + n)), and Q(z) = ½(1 − P(½, x)).
    let term = 2;
    let sum = 2;
    for (let n = 1; n < 500 && term > sum * EPS; n++) {
      term *= x / (0.5 + n);
      sum += term;
    }
    return x === 0 ? 0.5 : 0.5 * (1 - front * sum);
  }
  // Γ(½, x)/Γ(½) by its continued fraction.
  let b = x + 0.5;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 10000; i++) {
    const an = -i * (i - 0.5);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < EPS) break;
  }
  return 0.5 * front * h;
}

/** The z with Q(z) = tail, 0 < tail < 1 (the standard normal quantile of 1 − tail). */
export function normalQuantileUpper(tail: number): number {
  if (!(tail > 0 && tail < 1)) throw new RangeError(`normalQuantileUpper: tail probability ${tail} must lie in (0, 1)`);
  if (tail > 0.5) return -normalQuantileUpper(1 - tail);
  let lo = 0;
  let hi = 1;
  while (normalUpperTail(hi) > tail) {
    lo = hi;
    hi *= 2;
  }
  for (let i = 0; i < 200 && hi - lo > 1e-15 * hi; i++) {
    const mid = 0.5 * (lo + hi);
    if (normalUpperTail(mid) > tail) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
