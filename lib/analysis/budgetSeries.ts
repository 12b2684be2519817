import type { QuadraticBudget, StepReport } from '../model/budget';

/**
 * Time series of the energy and enstrophy budgets of a run, from the stepper's StepReports, in bounded
 * memory. Model units: E in length²/time², Z in 1/time², their rates per time (lib/model/budget.ts).
 *
 * Each sample covers a run of whole steps [tStart, tStart + duration] and holds the dt-weighted mean
 * of every term over them: the instantaneous rates are taken at the start of each step (left-point
 * rule for ∫ rate dt), `realizedTendency` is exact (its mean is ΔE/duration). `loss` = drag + hyper +
 * largeScale. `transferMax` is the largest |transfer| of any one step in the sample, so the per-step
 * closure of the budget stays visible after downsampling.
 *
 * Memory: at most `capacity` samples. When full, neighbours are merged in pairs (duration-weighted
 * means, sums of duration and steps, max of transferMax) and each sample from then on gathers twice as
 * many steps. The step still being gathered is shown as the last sample.
 */
export const BUDGET_TERMS = [
  'value',
  'injection',
  'drag',
  'hyper',
  'largeScale',
  'loss',
  'transfer',
  'tendency',
  'realizedTendency',
  'realizedInjection',
] as const;
export type BudgetTerm = (typeof BUDGET_TERMS)[number];

export type BudgetColumns = Record<BudgetTerm | 'transferMax', Float64Array>;

/** Columnar view of the series (subarrays of the series' own storage: read, don't keep). */
export interface BudgetSeriesColumns {
  /** Sample midpoint, start, duration (time) and number of steps. */
  time: Float64Array;
  tStart: Float64Array;
  duration: Float64Array;
  steps: Float64Array;
  /** Kinetic energy ½⟨|∇ψ|²⟩. */
  kinetic: Float64Array;
  energy: BudgetColumns;
  enstrophy: BudgetColumns;
}

export interface MeanWithError {
  mean: number;
  /** Batch-means standard error (NaN with fewer than 4 samples). */
  stdErr: number;
}

export interface BudgetWindowMean {
  /** The time actually covered (whole samples) and its steps and samples. */
  from: number;
  to: number;
  duration: number;
  steps: number;
  samples: number;
  kinetic: MeanWithError;
  energy: Record<BudgetTerm, MeanWithError>;
  enstrophy: Record<BudgetTerm, MeanWithError>;
}

// Column layout: 4 bookkeeping columns, kinetic, then the terms and transferMax of each budget.
const T_START = 0;
const DURATION = 1;
const STEPS = 2;
const KINETIC = 3;
const NT = BUDGET_TERMS.length;
const E0 = 4;
const Z0 = E0 + NT + 1;
const NCOLS = Z0 + NT + 1;
const isMax = (c: number) => c === E0 + NT || c === Z0 + NT;
const isMean = (c: number) => c >= KINETIC && !isMax(c);

export class BudgetSeries {
  readonly capacity: number;
  /** Steps per completed sample (doubles at each compaction). */
  stride = 1;
  /** Completed samples. */
  count = 0;
  private readonly cols: Float64Array[];
  private readonly time: Float64Array;
  private readonly acc = new Float64Array(NCOLS);

  /** capacity: an even number ≥ 4 of stored samples. */
  constructor(capacity = 4096) {
    if (!(Number.isInteger(capacity) && capacity >= 4 && capacity % 2 === 0)) {
      throw new RangeError(`BudgetSeries: capacity must be an even integer ≥ 4, got ${capacity}`);
    }
    this.capacity = capacity;
    this.cols = Array.from({ length: NCOLS }, () => new Float64Array(capacity + 1));
    this.time = new Float64Array(capacity + 1);
  }

  /** Add the report of one step (copies the numbers; the report may be reused). */
  push(r: StepReport): void {
    const a = this.acc;
    const dt = r.dt;
    if (a[STEPS] === 0) {
      a.fill(0);
      a[T_START] = r.time - dt;
    }
    a[DURATION] += dt;
    a[STEPS] += 1;
    a[KINETIC] += r.kinetic * dt;
    addBudget(a, E0, r.energy, dt);
    addBudget(a, Z0, r.enstrophy, dt);
    if (a[STEPS] < this.stride) return;
    if (this.count === this.capacity) {
      this.compact();
      return; // the gathered steps now make half a sample of the doubled stride
    }
    this.writeAcc(this.count);
    this.count++;
    a[STEPS] = 0;
  }

  /** Forget everything. */
  clear(): void {
    this.count = 0;
    this.stride = 1;
    this.acc[STEPS] = 0;
  }

  /** Number of samples including the one being gathered. */
  get length(): number {
    return this.count + (this.acc[STEPS] > 0 ? 1 : 0);
  }

  /** The series as columns for charts (views of internal storage, valid until the next push). */
  columns(): BudgetSeriesColumns {
    const n = this.length;
    if (n > this.count) this.writeAcc(this.count);
    const view = (c: number) => this.cols[c].subarray(0, n);
    const budget = (base: number): BudgetColumns => {
      const b = { transferMax: view(base + NT) } as BudgetColumns;
      BUDGET_TERMS.forEach((t, i) => (b[t] = view(base + i)));
      return b;
    };
    return {
      time: this.time.subarray(0, n),
      tStart: view(T_START),
      duration: view(DURATION),
      steps: view(STEPS),
      kinetic: view(KINETIC),
      energy: budget(E0),
      enstrophy: budget(Z0),
    };
  }

  /**
   * Duration-weighted means over the samples whose midpoint lies in [t0, t1], with batch-means
   * standard errors: the samples are cut into `batches` runs of consecutive samples, and
   * stdErr = sd(batch means)/√batches — a fair error when each batch is longer than the correlation
   * time of the series [practice].
   */
  timeMean(t0 = -Infinity, t1 = Infinity, batches = 10): BudgetWindowMean {
    this.columns(); // writes the sample being gathered
    const n = this.length;
    const { time, cols } = this;
    let lo = 0;
    while (lo < n && time[lo] < t0) lo++;
    let hi = lo;
    while (hi < n && time[hi] <= t1) hi++;
    const m = hi - lo;
    const nb = Math.min(batches, Math.floor(m / 2));
    const stat = (c: number): MeanWithError => {
      let sw = 0;
      let sx = 0;
      for (let i = lo; i < hi; i++) {
        sw += cols[DURATION][i];
        sx += cols[DURATION][i] * cols[c][i];
      }
      const mean = sx / sw;
      if (nb < 2) return { mean, stdErr: NaN };
      let ss = 0;
      for (let b = 0; b < nb; b++) {
        let bw = 0;
        let bx = 0;
        for (let i = lo + Math.floor((b * m) / nb); i < lo + Math.floor(((b + 1) * m) / nb); i++) {
          bw += cols[DURATION][i];
          bx += cols[DURATION][i] * cols[c][i];
        }
        ss += (bx / bw - mean) ** 2;
      }
      return { mean, stdErr: Math.sqrt(ss / (nb - 1) / nb) };
    };
    const budget = (base: number) => {
      const out = {} as Record<BudgetTerm, MeanWithError>;
      BUDGET_TERMS.forEach((t, i) => (out[t] = stat(base + i)));
      return out;
    };
    let steps = 0;
    let duration = 0;
    for (let i = lo; i < hi; i++) {
      steps += cols[STEPS][i];
      duration += cols[DURATION][i];
    }
    return {
      from: m > 0 ? cols[T_START][lo] : NaN,
      to: m > 0 ? cols[T_START][hi - 1] + cols[DURATION][hi - 1] : NaN,
      duration,
      steps,
      samples: m,
      kinetic: stat(KINETIC),
      energy: budget(E0),
      enstrophy: budget(Z0),
    };
  }

  /** The gathered sums, as a sample (means), into slot i. */
  private writeAcc(i: number): void {
    const a = this.acc;
    for (let c = 0; c < NCOLS; c++) this.cols[c][i] = isMean(c) ? a[c] / a[DURATION] : a[c];
    this.time[i] = a[T_START] + 0.5 * a[DURATION];
  }

  /** Merge neighbouring samples in pairs and double the stride. */
  private compact(): void {
    const half = this.capacity / 2;
    const d = this.cols[DURATION];
    // Every column but the durations first: the weighted means need the unmerged durations.
    for (let c = 0; c < NCOLS; c++) {
      if (c === DURATION) continue;
      const col = this.cols[c];
      for (let j = 0; j < half; j++) {
        const [x, y] = [col[2 * j], col[2 * j + 1]];
        if (isMean(c)) col[j] = (x * d[2 * j] + y * d[2 * j + 1]) / (d[2 * j] + d[2 * j + 1]);
        else if (isMax(c)) col[j] = Math.max(x, y);
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

function addBudget(a: Float64Array, base: number, b: QuadraticBudget, dt: number): void {
  a[base] += b.value * dt;
  a[base + 1] += b.injection * dt;
  a[base + 2] += b.drag * dt;
  a[base + 3] += b.hyper * dt;
  a[base + 4] += b.largeScale * dt;
  a[base + 5] += (b.drag + b.hyper + b.largeScale) * dt;
  a[base + 6] += b.transfer * dt;
  a[base + 7] += b.tendency * dt;
  a[base + 8] += b.realizedTendency * dt;
  a[base + 9] += b.realizedInjection * dt;
  a[base + NT] = Math.max(a[base + NT], Math.abs(b.transfer));
}
