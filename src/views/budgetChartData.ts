import type { BudgetColumns, BudgetSeriesColumns } from '../../lib/analysis/budgetSeries';

/** Columns of one chart: x (model time) first, then one column per series (uPlot's aligned data). */
export type ChartColumns = [Float64Array, ...(Float64Array | (number | null)[])[]];

export interface BudgetCharts {
  /** t, E, KE. */
  energy: ChartColumns;
  /** t, injection, drag loss, hyperviscous loss, large-scale-drag loss, tendency dE/dt. */
  energyRates: ChartColumns;
  /** The same for the enstrophy Z. */
  enstrophyRates: ChartColumns;
  /** t, |residual|/largest term for E and for Z (null where undefined, for a log axis). */
  residual: ChartColumns;
  /** The largest relative residual in the history (0 when there is none yet). */
  residualMax: number;
}

/**
 * Chart columns from the budget history, in buffers allocated once for `capacity` samples and reused
 * at every update (the columns returned are views of them, valid until the next update).
 */
export class BudgetChartData {
  private readonly cols: Float64Array[];
  private readonly residualE: (number | null)[] = [];
  private readonly residualZ: (number | null)[] = [];

  constructor(private readonly capacity: number) {
    // Columns: t, E, KE, then five rate terms for E and five for Z.
    this.cols = Array.from({ length: 13 }, () => new Float64Array(capacity));
  }

  update(c: BudgetSeriesColumns): BudgetCharts {
    const n = Math.min(c.time.length, this.capacity);
    const col = (i: number, src: Float64Array) => {
      const out = this.cols[i].subarray(0, n);
      out.set(src.subarray(0, n));
      return out;
    };
    const t = col(0, c.time);
    const rates = (base: number, b: BudgetColumns): ChartColumns => [
      t,
      col(base, b.injection),
      col(base + 1, b.drag),
      col(base + 2, b.hyper),
      col(base + 3, b.largeScale),
      col(base + 4, b.tendency),
    ];
    this.residualE.length = this.residualZ.length = n;
    let residualMax = 0;
    for (const [b, out] of [
      [c.energy, this.residualE],
      [c.enstrophy, this.residualZ],
    ] as const) {
      fillResidual(b, n, out);
      for (const r of out) if (r !== null && r > residualMax) residualMax = r;
    }
    return {
      energy: [t, col(1, c.energy.value), col(2, c.kinetic)],
      energyRates: rates(3, c.energy),
      enstrophyRates: rates(8, c.enstrophy),
      residual: [t, this.residualE, this.residualZ],
      residualMax,
    };
  }
}

/**
 * The budget's residual relative to its largest term: the largest per-step |transfer| of each sample
 * over the largest of |injection|, drag, hyperviscous and large-scale losses. The dealiased Jacobian
 * conserves E and Z exactly, so this sits at round-off, ~1e-16; anything larger is a bug.
 */
export function fillResidual(b: BudgetColumns, n: number, out: (number | null)[]): void {
  for (let i = 0; i < n; i++) {
    const scale = Math.max(
      Math.abs(b.injection[i]),
      Math.abs(b.drag[i]),
      Math.abs(b.hyper[i]),
      Math.abs(b.largeScale[i]),
    );
    const r = b.transferMax[i] / scale;
    out[i] = Number.isFinite(r) && r > 0 ? r : null;
  }
}
