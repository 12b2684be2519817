import { LOG_DENOMINATOR, LOG_FIRST, LOG_HI, LOG_LO } from './logTable';

/**
 * exp and log (and, in portableTrig.ts, cos and sin) that give the same bits on every JavaScript
 * engine. ECMA-262 leaves the accuracy of Math.exp, Math.log, Math.sin, Math.cos, … to the
 * implementation ("implementation-approximated"), and engines differ in the last bit: on random
 * arguments Node 20 (V8 11.3) and Chromium 156 disagree on about 3 % of sin and cos values, 7 % of exp
 * and 30 % of log values. A run must give the same bits in the browser and in Node, so the model
 * computes these itself from the operations IEEE 754 and ECMA-262 define to the bit: +, −, ×, / and √
 * correctly rounded (with no fused multiply-add in JavaScript), comparisons, rounding to an integer
 * (Math.round, Math.floor, or the sum below), and scaling by powers of two.
 *
 * Methods (accuracy about 1 ulp; test/model/portableMath.test.ts checks it against Math.* and
 * published values; lib/model uses no Math function whose last bits are left open):
 *   exp x    x = k·ln 2 + r, |r| ≤ ½ln 2 (ln 2 in two parts, the first with 11 trailing zero bits, so
 *            k·ln2Hi is exact); e^r by its Taylor series to r¹³ (the next term is below 2⁻⁵⁷ e^r);
 *            times 2^k from a table of exact powers of two
 *   log x    x = m·2^e with m in [3/4, 3/2) (e from the bits), m = c + d with c = j/64 the nearest
 *            point of a table of ln c (logTable.ts, to about 106 bits) and d exact; then
 *            ln m = ln c + 2 artanh s, s = d/(m + c), |s| ≤ 1/192, by its series to s⁷ (at c = 1 in
 *            the form d − (d²/2 − s(d²/2 + R)), which keeps the exact d in front); plus e·ln 2 in
 *            two parts
 *   cos, sin in portableTrig.ts
 */

// ln 2 = LN2_HI + LN2_LO + O(1e−26): LN2_HI has 42 significant bits.
const LN2_HI = 0.69314718055989033;
const LN2_LO = 5.49792301870721e-14;
const INV_LN2 = 1.4426950408889634;

/**
 * Adding and subtracting 1.5·2⁵² rounds a double of magnitude below 2⁵¹ to the nearest integer (ties to
 * even): two exact IEEE additions, cheaper than Math.round, and the same on every engine (neither
 * JavaScript nor IEEE 754 lets (x + C) − C be simplified to x).
 */
export const ROUNDER = 6755399441055744;

/** 1/k! for k = 0..18, each one correctly rounded division (k! is exact in a double up to 18!); portableTrig.ts uses them too. */
export const INV_FACT: number[] = [];
for (let k = 0, f = 1; k <= 18; k++, f *= k) INV_FACT.push(1 / f);
// The same as named constants: the polynomials below are written out for speed (no array reads).
const [, , F2, F3, F4, F5, F6, F7, F8, F9, F10, F11, F12, F13] = INV_FACT;

// Exact powers of two 2^k for k = −1022..1023 (repeated doubling and halving are exact).
const POW2 = new Float64Array(2046);
POW2[1022] = 1;
for (let k = 1; k <= 1023; k++) POW2[1022 + k] = POW2[1021 + k] * 2;
for (let k = 1; k <= 1022; k++) POW2[1022 - k] = POW2[1023 - k] * 0.5;

/** e^x, the same bits everywhere; Infinity above ≈ 709.78, 0 below ≈ −745.13. */
export function expPortable(x: number): number {
  if (!(x === x)) return NaN;
  if (x > 709.8) return Infinity;
  if (x < -745.2) return 0;
  const k = x * INV_LN2 + ROUNDER - ROUNDER;
  const r = x - k * LN2_HI - k * LN2_LO;
  // e^r = 1 + r + r²·(1/2! + r/3! + … + r¹¹/13!), the bracket in pairs (Estrin's scheme: the same
  // value to round-off, a quarter of the chain of dependent operations of Horner's).
  const r2 = r * r;
  const r4 = r2 * r2;
  const q0 = F2 + F3 * r + r2 * (F4 + F5 * r);
  const q1 = F6 + F7 * r + r2 * (F8 + F9 * r);
  const q2 = F10 + F11 * r + r2 * (F12 + F13 * r);
  const er = 1 + (r + r2 * (q0 + r4 * (q1 + r4 * q2)));
  if (k > 1023) return er * POW2[1022 + 1023] * 2;
  if (k >= -1022) return er * POW2[1022 + k];
  return er * POW2[1022 + k + 54] * POW2[1022 - 54];
}

// 2/(2k + 1) for k = 1..3: the artanh series of logPortable.
const A3 = 2 / 3;
const A5 = 2 / 5;
const A7 = 2 / 7;

// A view of a double's two 32-bit words; the high word's index follows the platform's byte order.
const bits = new Float64Array(1);
const words = new Uint32Array(bits.buffer);
const HIGH = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;

/** The natural logarithm, the same bits everywhere; −Infinity at 0, NaN below. */
export function logPortable(x: number): number {
  if (!(x > 0)) return x === 0 ? -Infinity : NaN;
  if (x === Infinity) return Infinity;
  // x = m·2^e with m in [1, 2): e from the exponent bits, m by an exact scaling (subnormals first made normal).
  let e = 0;
  if (x < 2.2250738585072014e-308) {
    x *= 18014398509481984; // 2^54
    e = -54;
  }
  bits[0] = x;
  const ex = ((words[HIGH] >>> 20) & 0x7ff) - 1023;
  e += ex;
  let m = ex < 1023 ? x * POW2[1022 - ex] : x * POW2[0] * 0.5;
  // Into [3/4, 3/2), so that x near 1 (from either side) has e = 0 and m near 1.
  if (m >= 1.5) {
    m *= 0.5;
    e += 1;
  }
  // m = c + d with c = j/64 the nearest table point; d is exact (Sterbenz).
  const j = m * LOG_DENOMINATOR + ROUNDER - ROUNDER;
  const c = j / LOG_DENOMINATOR;
  const d = m - c;
  // ln(m/c) = 2 artanh s with s = d/(m + c), |s| ≤ 1/192; R = 2s²/3 + 2s⁴/5 + 2s⁶/7 (the next term is below 2⁻⁶⁰).
  const s = d / (m + c);
  const z = s * s;
  const R = z * (A3 + z * (A5 + z * A7));
  let t: number;
  if (j === LOG_DENOMINATOR) {
    // c = 1, d = m − 1 exact: ln(1 + d) = d − (d²/2 − s(d²/2 + R)), with d in front (2s = d − sd).
    const hd = 0.5 * d * d;
    t = d - (hd - s * (hd + R));
  } else t = 2 * s + s * R; // ln c is at least 1/65 here: the rounding of s does not show
  // e·ln2Hi (exact) + ln c's head, with the rounding error of that sum kept (two-sum) for the tail.
  const k = j - LOG_FIRST;
  const a = e * LN2_HI;
  const head = a + LOG_HI[k];
  const back = head - a;
  const err = a - (head - back) + (LOG_HI[k] - back);
  return head + (t + (err + e * LN2_LO + LOG_LO[k]));
}
