import { cisTurnsPortable } from './portableTrig';
import { plainFloat64, type Float64Alloc } from './sharedArena';

/**
 * Complex FFTs of length n along the slow axis of a packed block: row r, batch column c at
 * 2·(r·cols + c) (re) and +1 (im). Every column is transformed independently, unnormalised:
 *   X[k] = Σ_r x[r] e^{sign·2πi·r·k/n},  sign = −1 forward, +1 backward.
 *
 * Algorithm: Stockham autosort (no bit reversal), radix 4, with one radix-2 stage first when log2 n
 * is odd, so the last stage is always the twiddle-free radix-4 one (len = 4). In each stage the
 * butterflies combine whole runs of s·cols contiguous complex values that share their twiddles, so
 * the inner loop is long, contiguous and branch-free; groups whose twiddles are all 1 skip the
 * multiplications. The last stage reads and writes the same positions, so callers that need a pass
 * over the result anyway (a transpose, pointwise products) can run `transformButLast` and do that
 * stage themselves inside their own pass (fusedStages.ts), saving a sweep over the whole block.
 */
export class BatchFFT {
  readonly n: number;
  readonly cols: number;
  /** The ping-pong partner of the data in `transform`, unless the caller passes its own. */
  readonly work: Float64Array;
  /** cos and sin of 2π·m/n, m = 0..n−1 (read by fused first stages; never written after construction). */
  readonly cosT: Float64Array;
  readonly sinT: Float64Array;

  /** `alloc` makes `work` (shared memory when threads share the transform: sharedArena.ts). */
  constructor(n: number, cols: number, alloc: Float64Alloc = plainFloat64) {
    if (!Number.isInteger(n) || n < 1 || (n & (n - 1)) !== 0)
      throw new RangeError(`BatchFFT: n = ${n} is not a power of two`);
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
    this.work = alloc(2 * n * cols);
  }

  /** Doubles per output block of the last stage (rows j·n/4 .. (j+1)·n/4 − 1): 2·(n/4)·cols. */
  get lastRun(): number {
    return 2 * (this.n >> 2) * this.cols;
  }

  /**
   * Transform `data` (length 2·n·cols), ping-ponging with `scratch` (which must not be `data`).
   * The result is left in `data` or in `scratch`; the array holding it is returned.
   */
  transform(data: Float64Array, sign: -1 | 1, scratch: Float64Array = this.work): Float64Array {
    const out = this.transformButLast(data, sign, scratch);
    if (this.n >= 4) lastStageInPlace(out, this.lastRun, sign);
    return out;
  }

  /**
   * Every stage but the last radix-4 one (for n ≥ 4; for n < 4 the whole transform). The caller
   * finishes with `lastStageInPlace` or a fused equivalent on the returned array.
   *
   * `c0`..`c1` (default: every column) limits the work to those batch columns. Columns are
   * independent, so threads that take disjoint ranges of columns (threadTeam.ts) need no
   * synchronisation between the stages, and every value is computed by the same operations
   * whatever the ranges: the same bits. Which array holds the result depends on n alone.
   */
  transformButLast(
    data: Float64Array,
    sign: -1 | 1,
    scratch: Float64Array = this.work,
    c0 = 0,
    c1 = this.cols,
  ): Float64Array {
    return this.stagesButLast(data, sign, scratch, false, c0, c1);
  }

  /**
   * The stages between the first and the last, for a caller that did the first stage itself (radix
   * `firstRadix` over the whole length, twiddles `cosT`, `sinT`) inside a pass of its own, into
   * `data`. Needs n ≥ 8, so that the first stage is not also the last. Columns `c0`..`c1` as for
   * `transformButLast`.
   */
  transformButFirstAndLast(
    data: Float64Array,
    sign: -1 | 1,
    scratch: Float64Array = this.work,
    c0 = 0,
    c1 = this.cols,
  ): Float64Array {
    if (this.n < 8) throw new RangeError('BatchFFT: below n = 8 the first stage is also the last');
    return this.stagesButLast(data, sign, scratch, true, c0, c1);
  }

  /** Radix of the first stage: 2 when log2 n is odd, else 4. */
  get firstRadix(): 2 | 4 {
    return (31 - Math.clz32(this.n)) % 2 === 1 ? 2 : 4;
  }

  private stagesButLast(
    data: Float64Array,
    sign: -1 | 1,
    scratch: Float64Array,
    skipFirst: boolean,
    c0: number,
    c1: number,
  ): Float64Array {
    if (scratch === data) throw new RangeError('BatchFFT: scratch must differ from the data');
    if (!(0 <= c0 && c0 <= c1 && c1 <= this.cols)) throw new RangeError(`BatchFFT: columns ${c0}..${c1} out of range`);
    let src = data;
    let dst = scratch;
    let len = this.n;
    let s = 1;
    let skip = skipFirst;
    if (this.firstRadix === 2 && len > 1) {
      if (!skip) {
        this.radix2(src, dst, len, sign, c0, c1);
        src = dst;
        dst = src === data ? scratch : data;
      }
      skip = false;
      len >>= 1;
      s <<= 1;
    }
    while (len > 4) {
      if (!skip) {
        this.radix4(src, dst, len, s, sign, c0, c1);
        const t = src;
        src = dst;
        dst = t;
      }
      skip = false;
      len >>= 2;
      s <<= 2;
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
  private radix4(
    src: Float64Array,
    dst: Float64Array,
    len: number,
    s: number,
    sign: number,
    c0: number,
    c1: number,
  ): void {
    const q = len >> 2;
    const cols = this.cols;
    const run = 2 * s * cols; // doubles per contiguous run
    const cosT = this.cosT;
    const sinT = this.sinT;
    // Columns c0..c1 of each of the run's s rows: a stretch of `seg` doubles every `step`, from
    // `first` (one stretch, the whole run, when every column is taken).
    const whole = c0 === 0 && c1 === cols;
    const first = whole ? 0 : 2 * c0;
    const seg = whole ? run : 2 * (c1 - c0);
    const step = whole ? run : 2 * cols;
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
        untwiddledRuns(src, dst, run, q * run, sign, first, seg, step);
        continue;
      }
      const m1 = p * s;
      const m3 = 3 * m1;
      const w2r = cosT[2 * m1],
        w2i = sign * sinT[2 * m1];
      // Twiddles of the A and B outputs: w^1 and w^3, swapped with them for sign = −1.
      const wAr = cosT[sign > 0 ? m1 : m3],
        wAi = sign * sinT[sign > 0 ? m1 : m3];
      const wBr = cosT[sign > 0 ? m3 : m1],
        wBi = sign * sinT[sign > 0 ? m3 : m1];
      for (let o = first; o < run; o += step) {
        for (let t = o, end = o + seg; t < end; t += 2) {
          const ar = src[i0 + t],
            ai = src[i0 + t + 1];
          const br = src[i1 + t],
            bi = src[i1 + t + 1];
          const cr = src[i2 + t],
            ci = src[i2 + t + 1];
          const dr = src[i3 + t],
            di = src[i3 + t + 1];
          const t0r = ar + cr,
            t0i = ai + ci;
          const t1r = ar - cr,
            t1i = ai - ci;
          const t2r = br + dr,
            t2i = bi + di;
          const ur = br - dr,
            ui = bi - di;
          dst[o0 + t] = t0r + t2r;
          dst[o0 + t + 1] = t0i + t2i;
          const x2r = t0r - t2r,
            x2i = t0i - t2i;
          dst[o2 + t] = x2r * w2r - x2i * w2i;
          dst[o2 + t + 1] = x2r * w2i + x2i * w2r;
          const xar = t1r - ui,
            xai = t1i + ur;
          dst[oA + t] = xar * wAr - xai * wAi;
          dst[oA + t + 1] = xar * wAi + xai * wAr;
          const xbr = t1r + ui,
            xbi = t1i - ur;
          dst[oB + t] = xbr * wBr - xbi * wBi;
          dst[oB + t + 1] = xbr * wBi + xbi * wBr;
        }
      }
    }
  }

  /**
   * The first stage when log2 n is odd: radix 2 over the whole length (s = 1), X0 = a + b,
   * X1 = (a − b)·w^p with w = e^{sign·2πi/n}.
   */
  private radix2(src: Float64Array, dst: Float64Array, len: number, sign: number, c0: number, c1: number): void {
    const q = len >> 1;
    const run = 2 * this.cols;
    const lo = 2 * c0;
    const hi = 2 * c1;
    const cosT = this.cosT;
    const sinT = this.sinT;
    for (let p = 0; p < q; p++) {
      const i0 = p * run;
      const i1 = i0 + q * run;
      const o0 = 2 * p * run;
      const o1 = o0 + run;
      const wr = cosT[p];
      const wi = sign * sinT[p];
      for (let t = lo; t < hi; t += 2) {
        const ar = src[i0 + t],
          ai = src[i0 + t + 1];
        const br = src[i1 + t],
          bi = src[i1 + t + 1];
        dst[o0 + t] = ar + br;
        dst[o0 + t + 1] = ai + bi;
        const xr = ar - br,
          xi = ai - bi;
        dst[o1 + t] = xr * wr - xi * wi;
        dst[o1 + t + 1] = xr * wi + xi * wr;
      }
    }
  }
}

/**
 * The last radix-4 stage (len = 4, twiddle-free) in place on `data`: the four inputs of a butterfly
 * sit at t, t + run, t + 2·run, t + 3·run and its outputs X0, X1, X2, X3 go back to the same four
 * places (run = BatchFFT.lastRun). fusedStages.ts repeats this butterfly inside its passes.
 */
export function lastStageInPlace(data: Float64Array, run: number, sign: number): void {
  untwiddledRuns(data, data, run, run, sign, 0, run, run);
}

/**
 * Twiddle-free radix-4 butterflies over one run of `run` doubles: inputs at t + j·stride, outputs
 * X0, X1, X2, X3 at t + j·run (j = 0..3), for t in the stretches [o, o + seg), o = first, first +
 * step, … below run (first = 0, seg = step = run: the whole run). With stride = run and src = dst
 * it works in place: each butterfly reads its four places before writing them.
 */
function untwiddledRuns(
  src: Float64Array,
  dst: Float64Array,
  run: number,
  stride: number,
  sign: number,
  first: number,
  seg: number,
  step: number,
): void {
  const i1 = stride;
  const i2 = 2 * stride;
  const i3 = 3 * stride;
  const o2 = 2 * run;
  // t1 + i·u is X1 for sign = +1 and X3 for sign = −1 (see radix4).
  const oA = sign > 0 ? run : 3 * run;
  const oB = sign > 0 ? 3 * run : run;
  for (let o = first; o < run; o += step) {
    for (let t = o, end = o + seg; t < end; t += 2) {
      const ar = src[t],
        ai = src[t + 1];
      const br = src[i1 + t],
        bi = src[i1 + t + 1];
      const cr = src[i2 + t],
        ci = src[i2 + t + 1];
      const dr = src[i3 + t],
        di = src[i3 + t + 1];
      const t0r = ar + cr,
        t0i = ai + ci;
      const t1r = ar - cr,
        t1i = ai - ci;
      const t2r = br + dr,
        t2i = bi + di;
      const ur = br - dr,
        ui = bi - di;
      dst[t] = t0r + t2r;
      dst[t + 1] = t0i + t2i;
      dst[o2 + t] = t0r - t2r;
      dst[o2 + t + 1] = t0i - t2i;
      dst[oA + t] = t1r - ui;
      dst[oA + t + 1] = t1i + ur;
      dst[oB + t] = t1r + ui;
      dst[oB + t + 1] = t1i - ur;
    }
  }
}
