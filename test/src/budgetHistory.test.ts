import { describe, expect, it } from 'vitest';
import { emptyReport } from '../../lib/model/budget';
import { BudgetHistory } from '../../src/budgetHistory';
import { BUDGET_ROW_WIDTH, writeBudgetRow, type BudgetRows } from '../../workers/budgetRows';

function rows(from: number, n: number): BudgetRows {
  const data = new Float64Array((n + 3) * BUDGET_ROW_WIDTH); // longer than the rows it holds, as sent
  for (let i = 0; i < n; i++) {
    const r = emptyReport();
    r.dt = 0.5;
    r.time = 0.5 * (from + i + 1);
    r.energy.value = from + i;
    writeBudgetRow(r, data, i);
  }
  return { rows: n, data };
}

describe('BudgetHistory', () => {
  it('keeps the rows of successive snapshots as one series', () => {
    const h = new BudgetHistory();
    expect(h.ingest(1, rows(0, 3))).toBe(true);
    expect(h.ingest(1, rows(3, 2))).toBe(true);
    expect(h.ingest(1, rows(5, 0))).toBe(false);
    const c = h.series.columns();
    expect(Array.from(c.time)).toEqual([0.25, 0.75, 1.25, 1.75, 2.25]);
    expect(Array.from(c.energy.value)).toEqual([0, 1, 2, 3, 4]);
  });

  it('starts again with a new run (a new epoch)', () => {
    const h = new BudgetHistory();
    h.ingest(1, rows(0, 4));
    expect(h.ingest(2, rows(0, 0))).toBe(true);
    expect(h.series.length).toBe(0);
    h.ingest(2, rows(0, 1));
    expect(h.series.length).toBe(1);
  });
});
