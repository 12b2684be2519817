import { describe, expect, it } from 'vitest';
import { BudgetSeries } from '../../lib/analysis/budgetSeries';
import { HovmollerAccumulator } from '../../lib/analysis/hovmoller';
import { ProfileTimeMean } from '../../lib/analysis/timeMean';
import { emptyReport } from '../../lib/model/budget';
import { Model } from '../../lib/model/model';
import { MonitoredRun } from '../../lib/run/monitoredRun';
import { resolveRunPlan } from '../../lib/run/runPlan';
import { estimateRunMemory } from '../../lib/run/runMemory';
import { reachableArrayBytes } from '../support/reachableBytes';

/**
 * Bounded memory for runs of any length: every accumulator of a run keeps at most its cap, however
 * many samples it is fed (the oldest merged in pairs), and holds exactly the arrays it was built
 * with. Fed far past their caps here; storage is counted from every typed array reachable from them.
 */
describe('accumulators stay at their caps', () => {
  it('the Hovmöller record keeps at most cap columns after 100 000 samples', () => {
    const h = new HovmollerAccumulator(16, 1, 8);
    const bytes = reachableArrayBytes(h).bytes;
    const profile = new Float64Array(16);
    for (let i = 0; i < 100_000; i++) {
      profile.fill(Math.sin(i));
      h.add(i, profile);
      if (h.view().columns > 8) throw new Error(`${h.view().columns} columns after ${i + 1} samples`);
    }
    expect(h.view().columns).toBeGreaterThanOrEqual(4);
    expect(h.view().samplesPerColumn).toBeGreaterThanOrEqual(100_000 / 8 / 2);
    expect(reachableArrayBytes(h).bytes).toBe(bytes);
  });

  it('the budget series keeps at most its capacity after 100 000 steps', () => {
    const b = new BudgetSeries(16);
    const bytes = reachableArrayBytes(b).bytes;
    const r = emptyReport();
    r.dt = 0.01;
    for (let i = 0; i < 100_000; i++) {
      r.time = 0.01 * (i + 1);
      r.energy.value = 1 + Math.sin(i);
      b.push(r);
      // The capacity, plus the sample being gathered.
      if (b.length > 17) throw new Error(`${b.length} samples after ${i + 1} steps`);
    }
    expect(b.stride).toBeGreaterThanOrEqual(100_000 / 16 / 2);
    expect(b.timeMean().duration).toBeCloseTo(1000, 6);
    expect(reachableArrayBytes(b).bytes).toBe(bytes);
  });

  it('the time means keep at most cap bins after 100 000 samples', () => {
    const m = new ProfileTimeMean(['a', 'b'], 8, { kind: 'last', span: 1e9, cap: 8 });
    const bytes = reachableArrayBytes(m).bytes;
    const p = { a: new Float64Array(8), b: new Float64Array(8) };
    const out = { a: new Float64Array(8), b: new Float64Array(8) };
    for (let i = 0; i < 100_000; i++) {
      p.a.fill(i);
      m.add(i, p);
    }
    const w = m.mean(out);
    expect(w.count).toBe(100_000);
    expect(out.a[0]).toBeCloseTo(49_999.5, 6);
    expect(m.binSize).toBeGreaterThanOrEqual(100_000 / 8);
    expect(reachableArrayBytes(m).bytes).toBe(bytes);
  });

  it('a measured run holds the same arrays after 2000 steps sampled at every step as when built', () => {
    const model = new Model({ nx: 32, ny: 32, kf: 8, dkf: 1.5, dt: 0.01, cfl: 0, mu: 0.05, eps: 0.05, nu: 1e-8 });
    const run = new MonitoredRun(model, resolveRunPlan(model.params, { steps: 2000, average: 1e3, sampleEvery: 0.01 }));
    const built = reachableArrayBytes(run).bytes;
    expect(built).toBe(estimateRunMemory(model.params).totalBytes);
    run.advance();
    expect(run.monitor.sampleCount).toBeGreaterThanOrEqual(1999); // t = 0.01·k lands a hair short at times
    expect(run.monitor.hovmoller.view().columns).toBeLessThanOrEqual(run.monitor.hovmoller.cap);
    expect(run.monitor.budget.length).toBeLessThanOrEqual(run.monitor.budget.capacity + 1);
    expect(reachableArrayBytes(run).bytes).toBe(built);
  });
});
