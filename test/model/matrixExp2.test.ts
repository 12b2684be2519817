import { describe, expect, it } from 'vitest';
import { expComplex2x2 } from '../../lib/model/matrixExp2';
import { seededSigned } from '../support/random';

type C2 = number[]; // 8 numbers: a11, a12, a21, a22 as (re, im)

function mul(a: C2, b: C2): C2 {
  const out = new Array<number>(8).fill(0);
  for (let i = 0; i < 2; i++)
    for (let j = 0; j < 2; j++)
      for (let k = 0; k < 2; k++) {
        const x = 2 * (2 * i + k);
        const y = 2 * (2 * k + j);
        const z = 2 * (2 * i + j);
        out[z] += a[x] * b[y] - a[x + 1] * b[y + 1];
        out[z + 1] += a[x] * b[y + 1] + a[x + 1] * b[y];
      }
  return out;
}

/** The ∞-norm of A: the largest row sum of the moduli of its entries. */
function norm(a: C2): number {
  const m = (i: number) => Math.hypot(a[2 * i], a[2 * i + 1]);
  return Math.max(m(0) + m(1), m(2) + m(3));
}

/**
 * e^A by its Taylor series (60 terms), after halving A until ‖A‖ ≤ 2 and squaring back: the
 * textbook route, slow and sure. Its rounding error, and that of any backward-stable method, is of
 * the order ε‖A‖e^‖A‖ [practice], which sets the tolerance below.
 */
function expReference(a: C2): C2 {
  let j = 0;
  while (norm(a) / 2 ** j > 2) j++;
  const s = a.map((x) => x / 2 ** j);
  let term: C2 = [1, 0, 0, 0, 0, 0, 1, 0];
  let sum: C2 = [...term];
  for (let n = 1; n <= 60; n++) {
    term = mul(term, s).map((x) => x / n);
    sum = sum.map((x, i) => x + term[i]);
  }
  for (let i = 0; i < j; i++) sum = mul(sum, sum);
  return sum;
}

const EPS = 2 ** -52;
const tolerance = (a: C2) => 8 * EPS * (1 + norm(a)) * Math.exp(norm(a));

function exp2(a: C2): C2 {
  const out = new Float64Array(10);
  expComplex2x2(a[0], a[1], a[2], a[3], a[4], a[5], a[6], a[7], out, 2);
  return Array.from(out.subarray(2));
}

function maxDiff(a: C2, b: C2): number {
  return Math.max(...a.map((x, i) => Math.abs(x - b[i])));
}

// The closed form e^A = e^T(cosh s I + sinh s/s Δ) for traceless Δ, Δ² = s²I [derived: Cayley–Hamilton
// for 2 × 2 matrices], against scaling and squaring of the Taylor series [practice].
describe('the 2 × 2 complex matrix exponential', () => {
  it('agrees with scaling and squaring on random matrices, both branches (|s²| below and above ¼)', () => {
    const r = seededSigned(5);
    for (const size of [0.05, 0.3, 1, 3]) {
      for (let trial = 0; trial < 40; trial++) {
        const a = Array.from({ length: 8 }, () => size * r());
        expect(maxDiff(exp2(a), expReference(a)), `size ${size}`).toBeLessThan(tolerance(a));
      }
    }
  });

  it('is exact in form where the eigenvalues meet (a defective matrix) and near it', () => {
    // [[λ, 1], [0, λ]] → e^λ [[1, 1], [0, 1]]
    const l = [0.3, -0.7];
    const e = Math.exp(0.3);
    const c = [e * Math.cos(-0.7), e * Math.sin(-0.7)];
    const got = exp2([l[0], l[1], 1, 0, 0, 0, l[0], l[1]]);
    expect(maxDiff(got, [c[0], c[1], c[0], c[1], 0, 0, c[0], c[1]])).toBeLessThan(4 * EPS);
    // s² just across the series limit on both sides gives the same matrix to round-off.
    for (const z of [0.25 - 1e-12, 0.25 + 1e-12]) {
      const a = [0.1, 0.2, z, 0, 1, 0, 0.1, 0.2];
      expect(maxDiff(exp2(a), expReference(a))).toBeLessThan(tolerance(a));
    }
  });

  it('does not overflow apart: strong damping with a large s decays to zero, not NaN', () => {
    const got = exp2([-800, 0, 30, 0, 40, 0, -790, 1]);
    for (const x of got) expect(Number.isFinite(x)).toBe(true);
    expect(Math.max(...got.map(Math.abs))).toBeLessThan(1e-300);
    // A diagonal matrix gives the scalar exponentials.
    const d = exp2([-0.4, 1.1, 0, 0, 0, 0, 0.2, -3]);
    expect(d[0]).toBeCloseTo(Math.exp(-0.4) * Math.cos(1.1), 15);
    expect(d[7]).toBeCloseTo(Math.exp(0.2) * Math.sin(-3), 15);
    expect(d[2] === 0 && d[3] === 0 && d[4] === 0 && d[5] === 0).toBe(true);
  });
});
