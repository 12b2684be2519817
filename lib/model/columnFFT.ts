/**
 * Complex FFT of length n down the columns of a packed block of `cols` complex columns.
 *
 * Data layout: row r, column c at 2·(r·cols + c) (re) and +1 (im), rows packed with no gap, so the
 * block is n·cols complex values. Every column is transformed independently, unnormalised:
 *   X[k] = Σ_r x[r] e^{sign·2πi·r·k/n},  sign = −1 forward, +1 backward.
 *
 * Algorithm: radix-2 Stockham autosort (no bit reversal). At each stage the butterflies pair whole
 * runs of s·cols contiguous complex values that share one twiddle, so the inner loop is long,
 * contiguous and branch-free, the same loop serves every column, and only the columns a caller
 * packs are touched (the 2/3-rule pruning of the stepper lives in that choice).
 */
export class ColumnFFT {
  readonly n: number;
  readonly cols: number;
  private readonly cosT: Float64Array;
  private readonly sinT: Float64Array;
  private readonly work: Float64Array;

  constructor(n: number, cols: number) {
    if (!Number.isInteger(n) || n < 1 || (n & (n - 1)) !== 0) throw new RangeError(`ColumnFFT: n = ${n} is not a power of two`);
    this.n = n;
    this.cols = cols;
    this.cosT = new Float64Array(n / 2 || 1);
    this.sinT = new Float64Array(n / 2 || 1);
    for (let p = 0; p < n / 2; p++) {
      this.cosT[p] = Math.cos((2 * Math.PI * p) / n);
      this.sinT[p] = Math.sin((2 * Math.PI * p) / n);
    }
    this.work = new Float64Array(2 * n * cols);
  }

  /** Transforms `data` in place (a scratch block of the same size is used internally). */
  transform(data: Float64Array, sign: -1 | 1): void {
    const { n, cols, cosT, sinT } = this;
    let src = data;
    let dst = this.work;
    let len = n; // current sub-transform length
    let s = 1; // current stride, in rows
    while (len > 1) {
      const half = len >> 1;
      const run = 2 * s * cols; // doubles per contiguous butterfly run
      const tw = s; // twiddle index step: exp(sign 2πi p/len) = table[p·s]
      for (let p = 0; p < half; p++) {
        const wr = cosT[p * tw];
        const wi = sign * sinT[p * tw];
        const a0 = p * run;
        const b0 = (p + half) * run;
        const o0 = 2 * p * run;
        const o1 = o0 + run;
        for (let t = 0; t < run; t += 2) {
          const ar = src[a0 + t];
          const ai = src[a0 + t + 1];
          const br = src[b0 + t];
          const bi = src[b0 + t + 1];
          dst[o0 + t] = ar + br;
          dst[o0 + t + 1] = ai + bi;
          const dr = ar - br;
          const di = ai - bi;
          dst[o1 + t] = dr * wr - di * wi;
          dst[o1 + t + 1] = dr * wi + di * wr;
        }
      }
      const tmp = src;
      src = dst;
      dst = tmp;
      len = half;
      s <<= 1;
    }
    if (src !== data) data.set(src);
  }
}
