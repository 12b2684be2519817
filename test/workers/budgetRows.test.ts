import { describe, expect, it } from 'vitest';
import { emptyReport, type StepReport } from '../../lib/model/budget';
import { BUDGET_ROW_WIDTH, BudgetRowBuffer, readBudgetRow, writeBudgetRow } from '../../workers/budgetRows';

/** A report whose every number is distinct, from step i. */
function report(i: number, dt = 0.01): StepReport {
  const r = emptyReport();
  r.time = (i + 1) * dt;
  r.dt = dt;
  r.kinetic = 1 + i;
  let k = 0;
  for (const b of [r.energy, r.enstrophy])
    for (const key of Object.keys(b) as (keyof typeof b)[]) b[key] = 100 * i + ++k;
  return r;
}

describe('budget rows', () => {
  it('write and read back every budget number of a report', () => {
    const rows = new Float64Array(2 * BUDGET_ROW_WIDTH);
    const r = report(3);
    writeBudgetRow(r, rows, 1);
    const back = readBudgetRow(rows, 1, emptyReport());
    expect(back.energy).toEqual(r.energy);
    expect(back.enstrophy).toEqual(r.enstrophy);
    expect([back.time, back.dt, back.kinetic]).toEqual([r.time, r.dt, r.kinetic]);
  });

  it('gathers rows, grows as needed, and hands them over oldest first', () => {
    const buf = new BudgetRowBuffer(1024, 4);
    for (let i = 0; i < 10; i++) buf.push(report(i));
    const out = buf.take();
    expect(out.rows).toBe(10);
    expect(Array.from({ length: 10 }, (_, i) => out.data[i * BUDGET_ROW_WIDTH + 2])).toEqual(
      Array.from({ length: 10 }, (_, i) => 1 + i),
    );
    expect(buf.length).toBe(0);
  });

  it('starts afresh in a returned buffer when it is big enough', () => {
    const buf = new BudgetRowBuffer(1024, 4);
    const spare = new Float64Array(8 * BUDGET_ROW_WIDTH);
    buf.push(report(0));
    buf.take(spare);
    buf.push(report(1));
    expect(buf.take().data).toBe(spare);
    buf.take(new Float64Array(1));
    buf.push(report(2));
    expect(buf.take().data.length).toBe(4 * BUDGET_ROW_WIDTH);
  });

  it('merges neighbours in pairs when full, keeping the time span and the dt-weighted means', () => {
    const buf = new BudgetRowBuffer(4, 4);
    const reports = [report(0, 0.01), report(1, 0.03), report(2, 0.01), report(3, 0.01), report(4, 0.02)];
    for (const r of reports) buf.push(r);
    const out = buf.take();
    // Rows 0+1 and 2+3 merged, then row 4 appended.
    expect(out.rows).toBe(3);
    const row = (j: number) => readBudgetRow(out.data, j, emptyReport());
    expect(row(0).dt).toBeCloseTo(0.04, 15);
    expect(row(0).time).toBe(reports[1].time);
    expect(row(0).energy.drag).toBeCloseTo((0.01 * reports[0].energy.drag + 0.03 * reports[1].energy.drag) / 0.04, 12);
    expect(row(1).kinetic).toBeCloseTo((reports[2].kinetic + reports[3].kinetic) / 2, 12);
    expect(row(2).energy).toEqual(reports[4].energy);
    const total = [0, 1, 2].reduce((s, j) => s + row(j).dt, 0);
    expect(total).toBeCloseTo(
      reports.reduce((s, r) => s + r.dt, 0),
      15,
    );
  });

  it('refuses an odd row limit', () => {
    expect(() => new BudgetRowBuffer(5)).toThrow(/even/);
  });
});
