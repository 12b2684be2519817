import type { MeanSeries } from './jetDetector';

/**
 * The averaging window of a time mean: every sample from time tStart on, or the samples of the last
 * `span` time units; either kept in at most `cap` stored bins (default 256, even).
 */
export type TimeWindow = { kind: 'since'; tStart: number; cap?: number } | { kind: 'last'; span: number; cap?: number };

/** The window actually averaged: first and last sample time, number of samples, profiles stored. */
export interface WindowReport {
  tStart: number;
  tEnd: number;
  count: number;
  stored: number;
}

/**
 * Running time means of a set of named profiles of one length (ū, q̄, u′v′, … of `ZonalMeans`).
 *
 * The mean is the plain average of the samples added, each with weight 1: a time mean when samples
 * come at equal intervals, which is the caller's job. Units are those of the profiles.
 *
 * Samples go into stored bins of `binSize` samples each (1 at first), a ring of at most `cap` bins.
 * When the ring is full, neighbouring bins are summed in pairs and `binSize` doubles, so memory stays
 * bounded. 'since' keeps every sample with t ≥ tStart. 'last' drops a bin when its first sample is
 * older than t − span (t the newest sample), so the window averaged always lies inside [t − span, t]
 * and its start moves in steps of at most one bin; `window` reports it. Adding allocates nothing.
 * The bins are consecutive batch means of the window: `series` gives them, with the mean, to the
 * jet detector's sampling-error estimate (jetDetector.ts).
 */
export class ProfileTimeMean<K extends string> {
  readonly names: readonly K[];
  readonly length: number;
  readonly spec: Readonly<TimeWindow>;
  /** Samples per stored bin (1 until the first pairing). */
  binSize = 1;
  private readonly width: number;
  private readonly cap: number;
  /** Bin sums, cap × width; bin counts and first/last sample times. */
  private readonly sums: Float64Array;
  private readonly counts: Float64Array;
  private readonly t0: Float64Array;
  private readonly t1: Float64Array;
  private head = 0;
  private bins = 0;
  private tLast = -Infinity;

  constructor(names: readonly K[], length: number, window: TimeWindow) {
    if (names.length === 0 || !(Number.isInteger(length) && length > 0))
      throw new RangeError('ProfileTimeMean: needs at least one profile name and a positive length');
    if (window.kind === 'since' && !Number.isFinite(window.tStart))
      throw new RangeError(`ProfileTimeMean: tStart = ${window.tStart} must be finite`);
    if (window.kind === 'last' && !(window.span > 0 && Number.isFinite(window.span)))
      throw new RangeError(`ProfileTimeMean: span = ${window.span} must be a positive finite time`);
    const c = window.cap ?? 256;
    if (!(Number.isInteger(c) && c >= 2 && c % 2 === 0))
      throw new RangeError(`ProfileTimeMean: cap = ${c} must be an even integer ≥ 2`);
    this.names = names;
    this.length = length;
    this.spec = window;
    this.width = names.length * length;
    this.cap = window.cap ?? 256;
    this.sums = new Float64Array(this.cap * this.width);
    this.counts = new Float64Array(this.cap);
    this.t0 = new Float64Array(this.cap);
    this.t1 = new Float64Array(this.cap);
  }

  /** Add the profiles of one instant t (non-decreasing from call to call). */
  add(t: number, profiles: Readonly<Record<K, ArrayLike<number>>>): void {
    if (!Number.isFinite(t) || t < this.tLast)
      throw new RangeError(`ProfileTimeMean: sample time ${t} is not finite or goes back from ${this.tLast}`);
    for (const name of this.names) {
      const p = profiles[name];
      if (!p || p.length !== this.length)
        throw new RangeError(`ProfileTimeMean: profile "${name}" missing or not of length ${this.length}`);
    }
    this.tLast = t;
    const spec = this.spec;
    if (spec.kind === 'since' && t < spec.tStart) return;
    // Stage 1: drop bins whose first sample has left the window.
    while (spec.kind === 'last' && this.bins > 0 && this.t0[this.head] < t - spec.span) {
      this.head = (this.head + 1) % this.cap;
      this.bins--;
    }
    // Stage 2: fill the newest bin, or open a new one (pairing bins first when the ring is full).
    let newest = (this.head + this.bins - 1) % this.cap;
    if (this.bins === 0 || this.counts[newest] >= this.binSize) {
      if (this.bins === this.cap) this.pairBins();
      newest = (this.head + this.bins) % this.cap;
      this.bins++;
      this.openBin(newest, t);
    }
    this.accumulate(newest, t, profiles);
  }

  private openBin(slot: number, t: number): void {
    this.sums.fill(0, slot * this.width, (slot + 1) * this.width);
    this.counts[slot] = 0;
    this.t0[slot] = t;
  }

  private accumulate(slot: number, t: number, profiles: Readonly<Record<K, ArrayLike<number>>>): void {
    const base = slot * this.width;
    for (let n = 0; n < this.names.length; n++) {
      const p = profiles[this.names[n]];
      const off = base + n * this.length;
      for (let j = 0; j < this.length; j++) this.sums[off + j] += p[j];
    }
    this.counts[slot]++;
    this.t1[slot] = t;
  }

  /** Sum bins (2p, 2p + 1) into bin p, oldest first (in ring order); halves the stored bins. */
  private pairBins(): void {
    const { cap, width, sums } = this;
    const half = this.bins / 2;
    for (let p = 0; p < half; p++) {
      const d = (this.head + p) % cap;
      const a = (this.head + 2 * p) % cap;
      const b = (this.head + 2 * p + 1) % cap;
      for (let i = 0; i < width; i++) sums[d * width + i] = sums[a * width + i] + sums[b * width + i];
      this.counts[d] = this.counts[a] + this.counts[b];
      this.t0[d] = this.t0[a];
      this.t1[d] = this.t1[b];
    }
    this.bins = half;
    this.binSize *= 2;
  }

  /** The window that `mean` would average now. */
  get window(): WindowReport {
    if (this.bins === 0) return { tStart: NaN, tEnd: NaN, count: 0, stored: 0 };
    let count = 0;
    for (let b = 0; b < this.bins; b++) count += this.counts[(this.head + b) % this.cap];
    const newest = (this.head + this.bins - 1) % this.cap;
    return { tStart: this.t0[this.head], tEnd: this.t1[newest], count, stored: this.bins };
  }

  /** The mean of each profile over the window into out[name]; throws when the window is empty. */
  mean(out: Record<K, Float64Array>): WindowReport {
    const w = this.window;
    if (w.count === 0) throw new RangeError('ProfileTimeMean: no samples in the window yet');
    const inv = 1 / w.count;
    for (let n = 0; n < this.names.length; n++) {
      const o = out[this.names[n]];
      if (!o || o.length !== this.length)
        throw new RangeError(`ProfileTimeMean: output "${this.names[n]}" missing or not of length ${this.length}`);
      o.fill(0);
      for (let b = 0; b < this.bins; b++) {
        const off = ((this.head + b) % this.cap) * this.width + n * this.length;
        for (let j = 0; j < this.length; j++) o[j] += this.sums[off + j];
      }
      for (let j = 0; j < this.length; j++) o[j] *= inv;
    }
    return w;
  }

  /**
   * The time mean of profile `name` over the window (into `mean`) with the series it is the mean of:
   * the complete bins, oldest first, as their means (the newest bin is left out while it is still
   * filling), their interval in time and the window's length (first to last sample plus one sample
   * interval, for samples at equal intervals). Null while the window is empty. Allocates the bins.
   */
  series(name: K, mean: Float64Array = new Float64Array(this.length)): MeanSeries | null {
    const n = this.names.indexOf(name);
    if (n < 0) throw new RangeError(`ProfileTimeMean: no profile "${name}"`);
    const w = this.window;
    if (w.count === 0) return null;
    if (mean.length !== this.length) throw new RangeError(`ProfileTimeMean: output not of length ${this.length}`);
    mean.fill(0);
    const newest = (this.head + this.bins - 1) % this.cap;
    const full = this.counts[newest] < this.binSize ? this.bins - 1 : this.bins;
    const bins = new Float64Array(full * this.length);
    for (let b = 0; b < this.bins; b++) {
      const slot = (this.head + b) % this.cap;
      const off = slot * this.width + n * this.length;
      for (let j = 0; j < this.length; j++) mean[j] += this.sums[off + j];
      if (b >= full) continue;
      const inv = 1 / this.counts[slot];
      for (let j = 0; j < this.length; j++) bins[b * this.length + j] = this.sums[off + j] * inv;
    }
    for (let j = 0; j < this.length; j++) mean[j] /= w.count;
    const sampleInterval = w.count > 1 ? (w.tEnd - w.tStart) / (w.count - 1) : 0;
    return {
      mean,
      bins,
      count: full,
      interval: sampleInterval * this.binSize,
      span: w.tEnd - w.tStart + sampleInterval,
      samples: w.count,
    };
  }

  /** Forget every sample (the window settings stay). */
  reset(): void {
    this.head = 0;
    this.bins = 0;
    this.binSize = 1;
    this.tLast = -Infinity;
  }
}
