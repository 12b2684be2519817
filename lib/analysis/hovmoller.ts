/**
 * A Hovmöller record of a meridional profile (ū(y, t) by default): columns in time, each the mean of
 * `samplesPerColumn` consecutive samples, values column-major (column c at data[c·ny .. (c+1)·ny)),
 * ready for a heatmap with time across and y up. Units: those of the profile; t and y model units.
 */
export interface HovmollerRecord {
  ny: number;
  Ly: number;
  /** Row positions y_j = j·Ly/ny. */
  y: Float64Array;
  /** Number of complete columns. */
  columns: number;
  /** Column times: the mean of the sample times in each column (length `columns`). */
  t: Float64Array;
  /** Column-major values, length columns·ny. */
  data: Float64Array;
  /** Samples averaged in each column (a power of two). */
  samplesPerColumn: number;
}

/**
 * Accumulates profiles into a Hovmöller record in bounded memory: at most `cap` columns (even). When a
 * column completes and the record is full, neighbouring columns are averaged in pairs (halving the
 * time resolution) and every later column averages twice as many samples, so all columns stay means
 * of equally many consecutive samples. The column being filled is not part of the record until it is
 * complete (`pending` counts its samples). `add` allocates nothing.
 */
export class HovmollerAccumulator {
  readonly ny: number;
  readonly Ly: number;
  readonly cap: number;
  readonly y: Float64Array;
  private readonly data: Float64Array;
  private readonly t: Float64Array;
  private columns = 0;
  private stride = 1;
  private readonly partSum: Float64Array;
  private partT = 0;
  private partCount = 0;
  private tLast = -Infinity;

  constructor(ny: number, Ly: number, cap = 512) {
    if (!(Number.isInteger(ny) && ny > 0))
      throw new RangeError(`HovmollerAccumulator: ny = ${ny} must be a positive integer`);
    if (!(Ly > 0 && Number.isFinite(Ly)))
      throw new RangeError(`HovmollerAccumulator: Ly = ${Ly} must be a positive finite length`);
    if (!(Number.isInteger(cap) && cap >= 2 && cap % 2 === 0))
      throw new RangeError(`HovmollerAccumulator: cap = ${cap} must be an even integer ≥ 2`);
    this.ny = ny;
    this.Ly = Ly;
    this.cap = cap;
    this.y = Float64Array.from({ length: ny }, (_, j) => (j * Ly) / ny);
    this.data = new Float64Array(cap * ny);
    this.t = new Float64Array(cap);
    this.partSum = new Float64Array(ny);
  }

  /** Samples in the column being filled. */
  get pending(): number {
    return this.partCount;
  }

  /** Add the profile of instant t (non-decreasing from call to call). */
  add(t: number, profile: ArrayLike<number>): void {
    if (!Number.isFinite(t) || t < this.tLast)
      throw new RangeError(`HovmollerAccumulator: sample time ${t} is not finite or goes back from ${this.tLast}`);
    if (profile.length !== this.ny)
      throw new RangeError(`HovmollerAccumulator: profile has ${profile.length} points, expected ${this.ny}`);
    this.tLast = t;
    for (let j = 0; j < this.ny; j++) this.partSum[j] += profile[j];
    this.partT += t;
    this.partCount++;
    if (this.partCount < this.stride) return;
    if (this.columns === this.cap) {
      this.halve();
      if (this.partCount < this.stride) return; // the part column now needs twice the samples
    }
    const { ny } = this;
    const inv = 1 / this.partCount;
    const off = this.columns * ny;
    for (let j = 0; j < ny; j++) this.data[off + j] = this.partSum[j] * inv;
    this.t[this.columns] = this.partT * inv;
    this.columns++;
    this.partSum.fill(0);
    this.partT = 0;
    this.partCount = 0;
  }

  /** Average columns (2p, 2p + 1) into column p; the record keeps cap/2 columns. */
  private halve(): void {
    const { ny, data } = this;
    const half = this.columns / 2;
    for (let p = 0; p < half; p++) {
      const d = p * ny;
      const a = 2 * p * ny;
      const b = a + ny;
      for (let j = 0; j < ny; j++) data[d + j] = 0.5 * (data[a + j] + data[b + j]);
      this.t[p] = 0.5 * (this.t[2 * p] + this.t[2 * p + 1]);
    }
    this.columns = half;
    this.stride *= 2;
  }

  /** The record as views into the accumulator's buffers: valid until the next `add`. */
  view(): HovmollerRecord {
    const n = this.columns;
    return {
      ny: this.ny,
      Ly: this.Ly,
      y: this.y,
      columns: n,
      t: this.t.subarray(0, n),
      data: this.data.subarray(0, n * this.ny),
      samplesPerColumn: this.stride,
    };
  }

  /** A copy of the record, safe to keep or transfer. */
  snapshot(): HovmollerRecord {
    const v = this.view();
    return { ...v, y: v.y.slice(), t: v.t.slice(), data: v.data.slice() };
  }

  /** Forget every sample. */
  reset(): void {
    this.columns = 0;
    this.stride = 1;
    this.partSum.fill(0);
    this.partT = 0;
    this.partCount = 0;
    this.tLast = -Infinity;
  }
}
