import { cisTurnsPortable } from './portableTrig';

/**
 * Complex FFTs of length n along the slow axis of a packed block: row r, batch column c at
 * 2·(r·cols + c) (re) and +1 (im). Every column is transformed independently, unnormalised:
 *   X[k] = Σ_r x[r] e^{sign·2πi·r·k/n},  sign = −1 forward, +1 backward.
 *
 * Algorithm: Stockham autosort (no bit reversal), radix 4 with one radix-2 stage when log2 n is
 * odd. In each stage the butterflies combine whole runs of s·cols contiguous complex values that
 * share their twiddles, so the inner loop is long, contiguous and branch-free; groups whose
 * twiddles are all 1 skip the multiplications.
 */
export class BatchFFT {
  readonly n: number;
  readonly cols: number;
  private readonly cosT: Float64Array;
  private readonly sinT: Float64Array;
  private readonly work: Float64Array;

  constructor(n: number, cols: number) {
    if (!Number.isInteger(n) || n < 1 || (n & (n - 1)) !== 0) throw new RangeError(`BatchFFT: n = ${n} is not a power of two`);
    this.n = n;
    this.cols = cols;
    this.cosT = new Float64Array(n);
    this.sinT = new Float64Array(n);
    // Twiddles cos, sin of 2π·m/n from the exact fraction m/n (portableTrig.ts: the same bits on every engine).
    const cs = new Float64Array(2);
    for (let m = 0; m < n; m++) {
      cisTurnsPortable(m / n, cs);
      this.cosT[m] = cs[0];
      this.sinT[m] = cs[1];
    }
    this.work = new Float64Array(2 * n * cols);
  }

  /**
   * Transform `data` (length 2·n·cols). The result is left in `data` or in the plan's own work
   * buffer; the array holding it is returned and stays valid until the next call.
   */
  transform(data: Float64Array, sign: -1 | 1): Float64Array {
    let src = data;
    let dst = this.work;
    let len = this.n;
    let s = 1;
    while (len >= 4) {
      this.radix4(src, dst, len, s, sign);
      const t = src;
      src = dst;
      dst = t;
      len >>= 2;
      s <<= 2;
    }
    if (len === 2) {
      this.radix2(src, dst, s);
      src = dst;
    }
    return src;
  }

  /** Transform and make sure the result is in `data`. */
  transformInPlace(data: Float64Array, sign: -1 | 1): void {
    const out = this.transform(data, sign);
    if (out !== data) data.set(out);
  }

  /**
   * One radix-4 stage. With u = b − d the two odd outputs are t1 ± i·u; which of them is X1 and which
   * X3 depends on the sign (j = sign·i), so the sign only swaps their destinations and twiddles
   * outside the inner loop instead of costing multiplications inside it.
   */
  private radix4(src: Float64Array, dst: Float64Array, len: number, s: number, sign: number): void {
    const q = len >> 2;
    const run = 2 * s * this.cols; // doubles per contiguous run
    const cosT = this.cosT;
    const sinT = this.sinT;
    for (let p = 0; p < q; p++) {
      const i0 = p * run;
      const i1 = i0 + q * run;
      const i2 = i1 + q * run;
      const i3 = i2 + q * run;
      const o0 = 4 * p * run;
      const o2 = o0 + 2 * run;
      // t1 + i·u goes to X1 for sign = +1, to X3 for sign = −1; t1 − i·u the other way round.
      const oA = sign > 0 ? o0 + run : o0 + 3 * run;
      const oB = sign > 0 ? o0 + 3 * run : o0 + run;
      if (p === 0) {
        for (let t = 0; t < run; t += 2) {
          const ar = src[i0 + t], ai = src[i0 + t + 1];
          const br = src[i1 + t], bi = src[i1 + t + 1];
          const cr = src[i2 + t], ci = src[i2 + t + 1];
          const dr = src[i3 + t], di = src[i3 + t + 1];
          const t0r = ar + cr, t0i = ai + ci;
          const t1r = ar - cr, t1i = ai - ci;
          const t2r = br + dr, t2i = bi + di;
          const ur = br - dr, ui = bi - di;
          dst[o0 + t] = t0r + t2r;
          dst[o0 + t + 1] = t0i + t2i;
          dst[o2 + t] = t0r - t2r;
          dst[o2 + t + 1] = t0i - t2i;
          dst[oA + t] = t1r - ui;
          dst[oA + t + 1] = t1i + ur;
          dst[oB + t] = t1r + ui;
          dst[oB + t + 1] = t1i - ur;
        }
        continue;
      }
      const m1 = p * s;
      const m3 = 3 * m1;
      const w2r = cosT[2 * m1], w2i = sign * sinT[2 * m1];
      // Twiddles of the A and B outputs: w^1 and w^3, swapped with them for sign = −1.
      const wAr = cosT[sign > 0 ? m1 : m3], wAi = sign * sinT[sign > 0 ? m1 : m3];
      const wBr = cosT[sign > 0 ? m3 : m1], wBi = sign * sinT[sign > 0 ? m3 : m1];
      for (let t = 0; t < run; t += 2) {
        const ar = src[i0 + t], ai = src[i0 + t + 1];
        const br = src[i1 + t], bi = src[i1 + t + 1];
        const cr = src[i2 + t], ci = src[i2 + t + 1];
        const dr = src[i3 + t], di = src[i3 + t + 1];
        const t0r = ar + cr, t0i = ai + ci;
        const t1r = ar - cr, t1i = ai - ci;
        const t2r = br + dr, t2i = bi + di;
        const ur = br - dr, ui = bi - di;
        dst[o0 + t] = t0r + t2r;
        dst[o0 + t + 1] = t0i + t2i;
        const x2r = t0r - t2r, x2i = t0i - t2i;
        dst[o2 + t] = x2r * w2r - x2i * w2i;
        dst[o2 + t + 1] = x2r * w2i + x2i * w2r;
        const xar = t1r - ui, xai = t1i + ur;
        dst[oA + t] = xar * wAr - xai * wAi;
        dst[oA + t + 1] = xar * wAi + xai * wAr;
        const xbr = t1r + ui, xbi = t1i - ur;
        dst[oB + t] = xbr * wBr - xbi * wBi;
        dst[oB + t + 1] = xbr * wBi + xbi * wBr;
      }
    }
  }

  /** The last stage when log2 n is odd: len = 2, all twiddles 1. */
  private radix2(src: Float64Array, dst: Float64Array, s: number): void {
    const run = 2 * s * this.cols;
    for (let t = 0; t < run; t++) {
      const a = src[t];
      const b = src[run + t];
      dst[t] = a + b;
      dst[run + t] = a - b;
    }
  }
}
