/**
 * The mean of the last `capacity` arrays added (all of one length): a ring of the arrays themselves,
 * summed afresh on each `mean` call, so no round-off builds up from adding and subtracting. Meant
 * for shell spectra and fluxes (hundreds of values, tens of samples); `add` allocates nothing.
 */
export class RecentMean {
  readonly length: number;
  readonly capacity: number;
  private readonly ring: Float64Array;
  private readonly times: Float64Array;
  private head = 0;
  private filled = 0;

  constructor(length: number, capacity: number) {
    if (!(Number.isInteger(length) && length > 0))
      throw new RangeError(`RecentMean: length = ${length} must be a positive integer`);
    if (!(Number.isInteger(capacity) && capacity > 0))
      throw new RangeError(`RecentMean: capacity = ${capacity} must be a positive integer`);
    this.length = length;
    this.capacity = capacity;
    this.ring = new Float64Array(length * capacity);
    this.times = new Float64Array(capacity);
  }

  /** Arrays held (at most `capacity`). */
  get count(): number {
    return this.filled;
  }

  /** Time of the oldest and of the newest array held (NaN when empty). */
  get span(): { tStart: number; tEnd: number } {
    if (this.filled === 0) return { tStart: NaN, tEnd: NaN };
    const oldest = (this.head - this.filled + this.capacity) % this.capacity;
    return { tStart: this.times[oldest], tEnd: this.times[(this.head - 1 + this.capacity) % this.capacity] };
  }

  /** Add the array of time t, replacing the oldest once full. */
  add(t: number, values: ArrayLike<number>): void {
    if (values.length !== this.length)
      throw new RangeError(`RecentMean: got ${values.length} values, expected ${this.length}`);
    const off = this.head * this.length;
    for (let i = 0; i < this.length; i++) this.ring[off + i] = values[i];
    this.times[this.head] = t;
    this.head = (this.head + 1) % this.capacity;
    this.filled = Math.min(this.filled + 1, this.capacity);
  }

  /** The mean of the arrays held into out (zeros when empty); returns out. */
  mean(out: Float64Array = new Float64Array(this.length)): Float64Array {
    out.fill(0);
    for (let b = 0; b < this.filled; b++) {
      const off = ((this.head - 1 - b + 2 * this.capacity) % this.capacity) * this.length;
      for (let i = 0; i < this.length; i++) out[i] += this.ring[off + i];
    }
    if (this.filled > 0) for (let i = 0; i < this.length; i++) out[i] /= this.filled;
    return out;
  }

  clear(): void {
    this.head = 0;
    this.filled = 0;
  }
}

/**
 * Means of consecutive blocks of `size` arrays, for arrays too large to keep a ring of (the 2D
 * spectrum): `mean` gives the last complete block, or the block being filled while none is complete.
 */
export class BlockMean {
  readonly length: number;
  size: number;
  private readonly sum: Float64Array;
  private readonly done: Float64Array;
  private count = 0;
  private doneCount = 0;

  constructor(length: number, size: number) {
    if (!(Number.isInteger(size) && size > 0))
      throw new RangeError(`BlockMean: size = ${size} must be a positive integer`);
    this.length = length;
    this.size = size;
    this.sum = new Float64Array(length);
    this.done = new Float64Array(length);
  }

  /** Arrays in the block `mean` returns. */
  get blockCount(): number {
    return this.doneCount || this.count;
  }

  add(values: ArrayLike<number>): void {
    if (values.length !== this.length)
      throw new RangeError(`BlockMean: got ${values.length} values, expected ${this.length}`);
    for (let i = 0; i < this.length; i++) this.sum[i] += values[i];
    if (++this.count < this.size) return;
    for (let i = 0; i < this.length; i++) this.done[i] = this.sum[i] / this.count;
    this.doneCount = this.count;
    this.sum.fill(0);
    this.count = 0;
  }

  mean(out: Float64Array = new Float64Array(this.length)): Float64Array {
    if (this.doneCount > 0) out.set(this.done);
    else for (let i = 0; i < this.length; i++) out[i] = this.count > 0 ? this.sum[i] / this.count : 0;
    return out;
  }

  clear(): void {
    this.sum.fill(0);
    this.count = 0;
    this.doneCount = 0;
  }
}
