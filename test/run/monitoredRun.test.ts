import { describe, expect, it } from 'vitest';
import { CLOCK_TOLERANCE } from '../../lib/model/clock';
import { Model } from '../../lib/model/model';
import { MonitoredRun } from '../../lib/run/monitoredRun';
import { resolveRunPlan } from '../../lib/run/runPlan';

const params = { nx: 32, ny: 32, kf: 8, dkf: 1.5, beta: 10, mu: 0.5, eps: 0.5, nu: 1e-8, dt: 0.05, cfl: 0.8 };

describe('monitored run', () => {
  it('stops by its rule, samples at equal intervals and summarises the window', () => {
    const model = new Model(params);
    const times: number[] = [];
    const run = new MonitoredRun(model, resolveRunPlan(model.params, { until: 10, average: 4, sampleEvery: 0.5 }), {
      onSample: (t) => times.push(t),
    });
    run.advance();
    expect(run.stopped).toBe('until');
    expect(model.time).toBeGreaterThanOrEqual(10);
    expect(model.time - model.dt).toBeLessThan(10);
    expect(times).toHaveLength(20);
    // Each sample at the first step ending on or after k·0.5 (to the clock's tolerance): within one step of it.
    times.forEach((t, k) => expect(t - 0.5 * (k + 1)).toBeGreaterThanOrEqual(-CLOCK_TOLERANCE * model.dt));
    times.forEach((t, k) => expect(t - 0.5 * (k + 1)).toBeLessThan(0.05 + 1e-12));
    const s = run.summary();
    expect(s.window_end).toBe(times[19]);
    expect(s.window_start!).toBeGreaterThanOrEqual(times[19] - 4);
  });

  it('stops at T after T/dt fixed steps, though the summed clock falls short of T by round-off', () => {
    // 500 steps of 0.01 add up to 4.99999999999994: the run must not take a 501st step.
    const fixed = { ...params, dt: 0.01, cfl: 0 };
    const model = new Model(fixed);
    const run = new MonitoredRun(model, resolveRunPlan(model.params, { until: 5, average: 1, sampleEvery: 0.1 }));
    run.advance();
    expect(run.stopped).toBe('until');
    expect(model.steps).toBe(500);
    expect(Math.abs(model.time - 5)).toBeLessThan(1e-12);
    // The rule changes when the run stops, not what a step computes: the same bits as 500 plain steps.
    const plain = new Model(fixed);
    plain.step(500);
    expect(Array.from(model.qHat)).toEqual(Array.from(plain.qHat));
    expect(plain.time).toBe(model.time);
  });

  it('still passes a target between two step ends rather than stopping short of it', () => {
    const model = new Model({ ...params, dt: 0.01, cfl: 0 });
    const run = new MonitoredRun(
      model,
      resolveRunPlan(model.params, { until: 0.105, average: 0.05, sampleEvery: 0.01 }),
    );
    run.advance();
    expect(model.steps).toBe(11);
  });

  it('takes the same bits in chunks as in one go, and counts steps from where it started', () => {
    const a = new MonitoredRun(new Model(params), resolveRunPlan(new Model(params).params, { steps: 120 }));
    a.advance();
    const b = new MonitoredRun(new Model(params), resolveRunPlan(new Model(params).params, { steps: 120 }));
    while (!b.advance(7));
    expect(b.model.steps).toBe(120);
    expect(b.summary()).toEqual(a.summary());
    expect(Array.from(b.model.qHat)).toEqual(Array.from(a.model.qHat));
  });

  it('stops once steady under strong drag, well before its cap', () => {
    const model = new Model(params);
    const run = new MonitoredRun(model, resolveRunPlan(model.params, { untilSteady: true, steadyTolerance: 0.1 }));
    run.advance();
    expect(run.stopped).toBe('steady');
    // Window 1/(2μ) = 1: at least 2 windows, and steady long before the cap of 20.
    expect(run.steady!.steadyAt).toBeGreaterThanOrEqual(2);
    expect(model.time).toBeLessThan(20);
  });
});
