import type { StepReport } from '../model/budget';

/**
 * Time series of a two-layer run's energy cycle and heat flux, from the stepper's StepReports
 * (lib/model/budget.ts `TwoLayerTerms`; docs/two-layer.md, "The energy cycle"), in bounded memory.
 * Model units: energies length²/time², rates per time, the heat flux ⟨vτ⟩ length³/time².
 *
 * As BudgetSeries: each sample covers whole steps and holds the dt-weighted mean of every term over
 * them (rates at the start of each step, the left-point rule); at most `capacity` samples, neighbours
 * merged in pairs when full, each later sample gathering twice as many steps. The step being
 * gathered shows as the last sample.
 */
export const CYCLE_TERMS = [
  'heatFlux',
  'generation',
  'conversion',
  'barotropicTransfer',
  'kineticBarotropic',
  'kineticBaroclinic',
  'potential',
  'kineticUpper',
  'kineticLower',
  'dragBarotropic',
  'dragBaroclinic',
  'hyperPotential',
  'hyperBaroclinic',
  'hyperBarotropic',
  'largeScalePotential',
  'largeScaleBaroclinic',
  'largeScaleBarotropic',
  'injection',
  'transfer',
] as const;
export type CycleTerm = (typeof CYCLE_TERMS)[number];

export interface CycleColumns {
  /** Sample midpoint, start and duration (time). */
  time: Float64Array;
  tStart: Float64Array;
  duration: Float64Array;
  terms: Record<CycleTerm, Float64Array>;
}

export interface CycleWindowMean {
  from: number;
  to: number;
  duration: number;
  samples: number;
  mean: Record<CycleTerm, number>;
}

const T_START = 0;
const DURATION = 1;
const STEPS = 2;
const T0 = 3;
const NCOLS = T0 + CYCLE_TERMS.length;

export class CycleSeries {
  readonly capacity: number;
  /** Steps per completed sample. */
  stride = 1;
  /** Completed samples. */
  count = 0;
  private readonly cols: Float64Array[];
  private readonly time: Float64Array;
  private readonly acc = new Float64Array(NCOLS);

  /** capacity: an even number ≥ 4 of stored samples. */
  constructor(capacity = 4096) {
    if (!(Number.isInteger(capacity) && capacity >= 4 && capacity % 2 === 0))
      throw new RangeError(`CycleSeries: capacity must be an even integer ≥ 4, got ${capacity}`);
    this.capacity = capacity;
    this.cols = Array.from({ length: NCOLS }, () => new Float64Array(capacity + 1));
    this.time = new Float64Array(capacity + 1);
  }

  /** Add the report of one two-layer step (throws for a one-layer report: it has no cycle). */
  push(r: StepReport): void {
    const L = r.layers;
    if (!L) throw new RangeError('CycleSeries: the step report has no two-layer terms');
    const a = this.acc;
    const dt = r.dt;
    if (a[STEPS] === 0) {
      a.fill(0);
      a[T_START] = r.time - dt;
    }
    a[DURATION] += dt;
    a[STEPS] += 1;
    for (let i = 0; i < CYCLE_TERMS.length; i++) a[T0 + i] += termOf(r, CYCLE_TERMS[i]) * dt;
    if (a[STEPS] < this.stride) return;
    if (this.count === this.capacity) {
      this.compact();
      return;
    }
    this.writeAcc(this.count);
    this.count++;
    a[STEPS] = 0;
  }

  /** Number of samples including the one being gathered. */
  get length(): number {
    return this.count + (this.acc[STEPS] > 0 ? 1 : 0);
  }

  /** The series as columns (views of internal storage, valid until the next push). */
  columns(): CycleColumns {
    const n = this.length;
    if (n > this.count) this.writeAcc(this.count);
    const view = (c: number) => this.cols[c].subarray(0, n);
    const terms = {} as Record<CycleTerm, Float64Array>;
    CYCLE_TERMS.forEach((t, i) => (terms[t] = view(T0 + i)));
    return { time: this.time.subarray(0, n), tStart: view(T_START), duration: view(DURATION), terms };
  }

  /** Duration-weighted means over the samples whose midpoint lies in [t0, t1]. */
  timeMean(t0 = -Infinity, t1 = Infinity): CycleWindowMean {
    const c = this.columns();
    let lo = 0;
    while (lo < c.time.length && c.time[lo] < t0) lo++;
    let hi = lo;
    while (hi < c.time.length && c.time[hi] <= t1) hi++;
    let duration = 0;
    for (let i = lo; i < hi; i++) duration += c.duration[i];
    const mean = {} as Record<CycleTerm, number>;
    for (const t of CYCLE_TERMS) {
      let s = 0;
      for (let i = lo; i < hi; i++) s += c.duration[i] * c.terms[t][i];
      mean[t] = s / duration;
    }
    return {
      from: hi > lo ? c.tStart[lo] : NaN,
      to: hi > lo ? c.tStart[hi - 1] + c.duration[hi - 1] : NaN,
      duration,
      samples: hi - lo,
      mean,
    };
  }

  private writeAcc(i: number): void {
    const a = this.acc;
    this.cols[T_START][i] = a[T_START];
    this.cols[DURATION][i] = a[DURATION];
    this.cols[STEPS][i] = a[STEPS];
    for (let c = T0; c < NCOLS; c++) this.cols[c][i] = a[c] / a[DURATION];
    this.time[i] = a[T_START] + 0.5 * a[DURATION];
  }

  private compact(): void {
    const half = this.capacity / 2;
    const d = this.cols[DURATION];
    for (let c = 0; c < NCOLS; c++) {
      if (c === DURATION) continue;
      const col = this.cols[c];
      for (let j = 0; j < half; j++) {
        const [x, y] = [col[2 * j], col[2 * j + 1]];
        if (c >= T0) col[j] = (x * d[2 * j] + y * d[2 * j + 1]) / (d[2 * j] + d[2 * j + 1]);
        else col[j] = c === T_START ? x : x + y;
      }
    }
    for (let j = 0; j < half; j++) {
      d[j] = d[2 * j] + d[2 * j + 1];
      this.time[j] = this.cols[T_START][j] + 0.5 * d[j];
    }
    this.count = half;
    this.stride *= 2;
  }
}

function termOf(r: StepReport, t: CycleTerm): number {
  switch (t) {
    case 'generation':
      return r.energy.generation ?? 0;
    case 'injection':
      return r.energy.injection;
    case 'transfer':
      return r.energy.transfer;
    default:
      return r.layers![t];
  }
}
