import { BudgetSeries } from '../lib/analysis/budgetSeries';
import { emptyReport } from '../lib/model/budget';
import { readBudgetRow, type BudgetRows } from '../workers/budgetRows';

/** Samples the budget history keeps before it halves its resolution (lib/analysis/budgetSeries.ts). */
export const BUDGET_HISTORY_SAMPLES = 2048;

/**
 * The UI's record of a run's energy and enstrophy budgets: the budget rows of every snapshot, fed
 * into a bounded series that downsamples (merges pairs) once it is full. A new epoch (a new run, a
 * loaded file, a new domain) starts it again.
 */
export class BudgetHistory {
  readonly series = new BudgetSeries(BUDGET_HISTORY_SAMPLES);
  private epoch = -1;
  private readonly scratch = emptyReport();

  /** Add the rows of one snapshot; returns true when anything changed. */
  ingest(epoch: number, rows: BudgetRows): boolean {
    let changed = false;
    if (epoch !== this.epoch) {
      this.epoch = epoch;
      this.series.clear();
      changed = true;
    }
    for (let i = 0; i < rows.rows; i++) this.series.push(readBudgetRow(rows.data, i, this.scratch));
    return changed || rows.rows > 0;
  }
}
