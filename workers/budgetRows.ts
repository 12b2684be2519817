import type { QuadraticBudget, StepReport } from '../lib/model/budget';

/** The terms of one quadratic budget, in the order they sit in a row. */
const TERMS = [
  'value',
  'injection',
  'drag',
  'hyper',
  'largeScale',
  'transfer',
  'tendency',
  'realizedTendency',
  'realizedInjection',
] as const;
const NT = TERMS.length;

/**
 * One budget row per step, flat: [time, dt, kinetic, energy terms…, enstrophy terms…] (model units,
 * as in lib/model/budget.ts). `time` is the model time after the step, `dt` the time it covered.
 * A row that stands for several merged steps has their summed dt and dt-weighted mean terms.
 */
export const BUDGET_ROW_WIDTH = 3 + 2 * NT;
const E0 = 3;
const Z0 = 3 + NT;

/** Write the budget part of a step report into row `row` of `out`. */
export function writeBudgetRow(r: StepReport, out: Float64Array, row: number): void {
  const o = row * BUDGET_ROW_WIDTH;
  out[o] = r.time;
  out[o + 1] = r.dt;
  out[o + 2] = r.kinetic;
  for (let i = 0; i < NT; i++) {
    out[o + E0 + i] = r.energy[TERMS[i]];
    out[o + Z0 + i] = r.enstrophy[TERMS[i]];
  }
}

/** Read row `row` of `rows` back into a report (fields a row does not carry are left alone). */
export function readBudgetRow(rows: Float64Array, row: number, into: StepReport): StepReport {
  const o = row * BUDGET_ROW_WIDTH;
  into.time = rows[o];
  into.dt = rows[o + 1];
  into.kinetic = rows[o + 2];
  const e: QuadraticBudget = into.energy;
  const z: QuadraticBudget = into.enstrophy;
  for (let i = 0; i < NT; i++) {
    e[TERMS[i]] = rows[o + E0 + i];
    z[TERMS[i]] = rows[o + Z0 + i];
  }
  return into;
}

/** Budget rows gathered since the last snapshot; `data` may be longer than `rows` rows. */
export interface BudgetRows {
  rows: number;
  data: Float64Array;
}

/**
 * The rows a worker gathers between two snapshots. It grows by doubling up to `maxRows`; should the UI
 * stop asking for so long that it fills (a hidden page whose animation frames are paused), neighbouring
 * rows merge in pairs, so the history keeps its whole time span at a coarser step.
 */
export class BudgetRowBuffer {
  private data: Float64Array;
  private rows = 0;

  constructor(
    private readonly maxRows = 1 << 14,
    private readonly minRows = 64,
  ) {
    if (!(maxRows >= 2 && maxRows % 2 === 0))
      throw new RangeError('BudgetRowBuffer: maxRows must be an even number ≥ 2');
    this.data = new Float64Array(minRows * BUDGET_ROW_WIDTH);
  }

  get length(): number {
    return this.rows;
  }

  push(r: StepReport): void {
    if (this.rows * BUDGET_ROW_WIDTH === this.data.length) {
      if (this.rows >= this.maxRows) this.mergePairs();
      else this.grow();
    }
    writeBudgetRow(r, this.data, this.rows++);
  }

  clear(): void {
    this.rows = 0;
  }

  /**
   * Hand over the gathered rows and start afresh in `spare` (a buffer the UI sent back) when it is
   * big enough to be worth reusing, else in a new small buffer.
   */
  take(spare?: Float64Array | null): BudgetRows {
    const out = { rows: this.rows, data: this.data };
    this.data =
      spare && spare.length >= this.minRows * BUDGET_ROW_WIDTH
        ? spare
        : new Float64Array(this.minRows * BUDGET_ROW_WIDTH);
    this.rows = 0;
    return out;
  }

  private grow(): void {
    const next = new Float64Array(Math.min(2 * this.data.length, this.maxRows * BUDGET_ROW_WIDTH));
    next.set(this.data);
    this.data = next;
  }

  /** Merge rows 2j and 2j+1 into row j: the later time, summed dt, dt-weighted means. */
  private mergePairs(): void {
    const d = this.data;
    const W = BUDGET_ROW_WIDTH;
    const half = this.rows >> 1;
    for (let j = 0; j < half; j++) {
      const a = 2 * j * W;
      const b = a + W;
      const o = j * W;
      const dt = d[a + 1] + d[b + 1];
      const wa = d[a + 1] / dt;
      const wb = d[b + 1] / dt;
      const time = d[b];
      for (let c = 2; c < W; c++) d[o + c] = wa * d[a + c] + wb * d[b + c];
      d[o] = time;
      d[o + 1] = dt;
    }
    if (this.rows % 2) d.copyWithin(half * W, (this.rows - 1) * W, this.rows * W);
    this.rows = half + (this.rows % 2);
  }
}
