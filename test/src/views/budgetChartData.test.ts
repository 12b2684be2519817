import { describe, expect, it } from 'vitest';
import { BudgetSeries } from '../../../lib/analysis/budgetSeries';
import { emptyReport } from '../../../lib/model/budget';
import { BudgetChartData } from '../../../src/views/budgetChartData';

/** A series of n steps whose terms are all different, energy from enstrophy too. */
function series(n: number): BudgetSeries {
  const s = new BudgetSeries(64);
  for (let i = 0; i < n; i++) {
    const r = emptyReport();
    r.dt = 0.1;
    r.time = 0.1 * (i + 1);
    r.kinetic = 0.5 + i;
    Object.assign(r.energy, {
      value: 1 + i,
      injection: 2,
      drag: 3,
      hyper: 4,
      largeScale: 5,
      tendency: 6,
      transfer: 1e-16,
    });
    Object.assign(r.enstrophy, {
      value: 10,
      injection: 20,
      drag: 30,
      hyper: 40,
      largeScale: 50,
      tendency: 60,
      transfer: 0,
    });
    s.push(r);
  }
  return s;
}

describe('budget chart columns', () => {
  it('put each budget term in its own column, energy apart from enstrophy', () => {
    const c = new BudgetChartData(65).update(series(5).columns());
    expect(Array.from(c.energy[0])).toEqual(Array.from(series(5).columns().time));
    // Sample means are dt-weighted sums over dt, so they carry round-off.
    Array.from(c.energy[1] as Float64Array).forEach((v, i) => expect(v).toBeCloseTo(1 + i, 12));
    Array.from(c.energy[2] as Float64Array).forEach((v, i) => expect(v).toBeCloseTo(0.5 + i, 12));
    c.energyRates.slice(1).forEach((col, i) => expect(col[0]).toBeCloseTo(2 + i, 12));
    c.enstrophyRates.slice(1).forEach((col, i) => expect(col[0]).toBeCloseTo(20 + 10 * i, 12));
    expect(c.energyRates[0]).toBe(c.enstrophyRates[0]);
  });

  it('give the residual relative to the largest term, and null where it is exactly zero', () => {
    const c = new BudgetChartData(65).update(series(3).columns());
    expect(c.residual[1][0]).toBeCloseTo(1e-16 / 5, 30);
    expect(c.residual[2]).toEqual([null, null, null]);
    expect(c.residualMax).toBeCloseTo(1e-16 / 5, 30);
  });

  it('reuse their buffers from one update to the next', () => {
    const d = new BudgetChartData(65);
    const a = d.update(series(3).columns());
    const b = d.update(series(4).columns());
    expect(b.energy[1].length).toBe(4);
    expect((a.energy[1] as Float64Array).buffer).toBe((b.energy[1] as Float64Array).buffer);
  });
});
