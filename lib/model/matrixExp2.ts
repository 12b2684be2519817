import { expPortable, INV_FACT } from './portableMath';
import { cisPortable } from './portableTrig';

/** Below this |s²| the series of cosh s and sinh s / s are used (their terms fall by ≥ 48 each). */
const SERIES_LIMIT = 0.25;
/** Highest power of s² in the series: the first left out, |s²|⁹/18!, is below 1e−21 for |s²| < ¼. */
const SERIES_TERMS = 8;

// Module-level scratch: (cos, sin) pairs; the function allocates nothing.
const cs = new Float64Array(2);

/**
 * e^A of a 2 × 2 complex matrix A, with the model's portable maths (the same bits on every engine).
 * Write A = T·I + Δ with T = tr A / 2 and Δ = A − T·I traceless. Then Δ² = s² I (Cayley–Hamilton),
 * s² = ((a₁₁ − a₂₂)/2)² + a₁₂a₂₁, and
 *   e^A = e^T (cosh s · I + (sinh s / s) · Δ).
 * cosh s and sinh s / s are even in s, so either root of s² serves. For |s²| < ¼ both come from their
 * Taylor series in s², which stays accurate where the eigenvalues T ± s meet (the matrix may then be
 * defective and an eigenvector form breaks down); otherwise e^T cosh s = (e^{T+s} + e^{T−s})/2 and
 * e^T sinh s / s = (e^{T+s} − e^{T−s})/(2s), each exponential taken whole, so that a large damping in
 * T and a large s do not overflow apart. About 1e−15 relative to the largest entry.
 *
 * Arguments: the entries of A as (re, im) pairs, row by row; out receives e^A the same way at
 * out[at..at+7] (a₁₁, a₁₂, a₂₁, a₂₂, each re then im).
 */
export function expComplex2x2(
  a11r: number,
  a11i: number,
  a12r: number,
  a12i: number,
  a21r: number,
  a21i: number,
  a22r: number,
  a22i: number,
  out: Float64Array,
  at: number,
): void {
  const tr = 0.5 * (a11r + a22r);
  const ti = 0.5 * (a11i + a22i);
  const dr = 0.5 * (a11r - a22r);
  const di = 0.5 * (a11i - a22i);
  const zr = dr * dr - di * di + (a12r * a21r - a12i * a21i);
  const zi = 2 * dr * di + (a12r * a21i + a12i * a21r);
  const zAbs = Math.sqrt(zr * zr + zi * zi);
  let chr: number, chi: number, shr: number, shi: number; // e^T cosh s and e^T sinh s / s
  if (zAbs < SERIES_LIMIT) {
    // cosh s = Σ zⁿ/(2n)!, sinh s / s = Σ zⁿ/(2n + 1)!, by Horner from the highest term.
    let cr = INV_FACT[2 * SERIES_TERMS],
      ci = 0,
      sr = INV_FACT[2 * SERIES_TERMS + 1],
      si = 0;
    for (let n = SERIES_TERMS - 1; n >= 0; n--) {
      const cr2 = cr * zr - ci * zi + INV_FACT[2 * n];
      ci = cr * zi + ci * zr;
      cr = cr2;
      const sr2 = sr * zr - si * zi + INV_FACT[2 * n + 1];
      si = sr * zi + si * zr;
      sr = sr2;
    }
    const e = expPortable(tr);
    cisPortable(ti, cs);
    const er = e * cs[0];
    const ei = e * cs[1];
    chr = er * cr - ei * ci;
    chi = er * ci + ei * cr;
    shr = er * sr - ei * si;
    shi = er * si + ei * sr;
  } else {
    // s = √z, principal root (√ is correctly rounded everywhere).
    const sr = Math.sqrt(0.5 * (zAbs + zr));
    const si = zi < 0 ? -Math.sqrt(0.5 * (zAbs - zr)) : Math.sqrt(0.5 * (zAbs - zr));
    const ep = expPortable(tr + sr);
    cisPortable(ti + si, cs);
    const pr = ep * cs[0];
    const pi = ep * cs[1];
    const em = expPortable(tr - sr);
    cisPortable(ti - si, cs);
    const mr = em * cs[0];
    const mi = em * cs[1];
    chr = 0.5 * (pr + mr);
    chi = 0.5 * (pi + mi);
    // (p − m) / (2s)
    const nr = 0.5 * (pr - mr);
    const ni = 0.5 * (pi - mi);
    const den = sr * sr + si * si;
    shr = (nr * sr + ni * si) / den;
    shi = (ni * sr - nr * si) / den;
  }
  const sdr = shr * dr - shi * di;
  const sdi = shr * di + shi * dr;
  out[at] = chr + sdr;
  out[at + 1] = chi + sdi;
  out[at + 2] = shr * a12r - shi * a12i;
  out[at + 3] = shr * a12i + shi * a12r;
  out[at + 4] = shr * a21r - shi * a21i;
  out[at + 5] = shr * a21i + shi * a21r;
  out[at + 6] = chr - sdr;
  out[at + 7] = chi - sdi;
}
