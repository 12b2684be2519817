import { describe, expect, it } from 'vitest';
import { BudgetSeries } from '../../lib/analysis/budgetSeries';
import { balanceVelocity } from '../../lib/analysis/scales';
import { emptyReport, type StepReport } from '../../lib/model/budget';
import { Model } from '../../lib/model/model';
import { seededSigned } from '../support/random';

/** A synthetic report of a step ending at time t. */
function report(t: number, dt: number, value: number, transfer = 0): StepReport {
  const r = emptyReport();
  r.time = t;
  r.dt = dt;
  r.kinetic = value;
  r.energy.value = value;
  r.energy.drag = 2 * value;
  r.energy.hyper = 0.5;
  r.energy.transfer = transfer;
  r.enstrophy.value = 3 * value;
  return r;
}

describe('BudgetSeries bookkeeping', () => {
  it('keeps at most `capacity` samples, merging pairs, and conserves durations, steps and ∫ value dt', () => {
    const series = new BudgetSeries(8);
    const next = seededSigned(41);
    next();
    let t = 0;
    let integral = 0;
    let worst = 0;
    for (let i = 0; i < 100; i++) {
      const dt = i % 2 === 0 ? 0.1 : 0.25;
      const value = Math.sin(t) + next();
      const transfer = 1e-15 * next();
      integral += value * dt;
      worst = Math.max(worst, Math.abs(transfer));
      t += dt;
      series.push(report(t, dt, value, transfer));
      expect(series.count).toBeLessThanOrEqual(8);
    }
    // 100 steps: strides 1, 2, 4, 8, 16 after four compactions (at 8, 16, 32, 64 steps).
    expect(series.stride).toBe(16);
    const c = series.columns();
    expect(c.time.length).toBe(series.length);
    let steps = 0,
      dur = 0,
      int = 0,
      tmax = 0;
    for (let i = 0; i < c.time.length; i++) {
      steps += c.steps[i];
      dur += c.duration[i];
      int += c.duration[i] * c.energy.value[i];
      tmax = Math.max(tmax, c.energy.transferMax[i]);
      if (i < series.count) expect(c.steps[i]).toBe(16);
      expect(c.time[i]).toBeCloseTo(c.tStart[i] + c.duration[i] / 2, 14);
      if (i > 0) expect(Math.abs(c.tStart[i] - (c.tStart[i - 1] + c.duration[i - 1]))).toBeLessThan(1e-12);
      expect(c.energy.loss[i]).toBeCloseTo(c.energy.drag[i] + c.energy.hyper[i], 13);
    }
    expect(steps).toBe(100);
    expect(Math.abs(dur - t)).toBeLessThan(1e-12);
    expect(Math.abs(int - integral)).toBeLessThan(1e-12 * Math.abs(dur));
    expect(tmax).toBe(worst);
    // The whole-run mean is the dt-weighted mean of the steps.
    const m = series.timeMean();
    expect(m.steps).toBe(100);
    expect(Math.abs(m.energy.value.mean - integral / t)).toBeLessThan(1e-13);
    expect(Math.abs(m.enstrophy.value.mean - (3 * integral) / t)).toBeLessThan(1e-13);
  });

  it('averages over the samples whose midpoint lies in the window', () => {
    const series = new BudgetSeries(64);
    for (let i = 1; i <= 40; i++) series.push(report(0.5 * i, 0.5, i));
    const m = series.timeMean(5, 10); // midpoints 5.25 … 9.75: steps 11 … 20
    expect(m.samples).toBe(10);
    expect(m.from).toBe(5);
    expect(m.to).toBe(10);
    expect(m.energy.value.mean).toBeCloseTo(15.5, 13);
    expect(m.energy.hyper.mean).toBe(0.5);
    expect(m.energy.hyper.stdErr).toBe(0);
  });

  it('gives a batch-means standard error that matches σ/√n for independent samples', () => {
    // 40 batches of 50 uniform(−1, 1) values: σ = 1/√3, and the estimate is good to ~11% (1σ).
    const series = new BudgetSeries(4096);
    const next = seededSigned(8);
    next();
    for (let i = 1; i <= 2000; i++) series.push(report(i, 1, next()));
    const m = series.timeMean(-Infinity, Infinity, 40);
    expect(Math.abs(m.energy.value.stdErr / (1 / Math.sqrt(3 * 2000)) - 1)).toBeLessThan(0.35);
  });

  it('refuses a capacity that cannot be halved', () => {
    expect(() => new BudgetSeries(7)).toThrow(RangeError);
    expect(() => new BudgetSeries(2)).toThrow(RangeError);
  });
});

describe('BudgetSeries of a forced run', () => {
  /** Run to time T, checking the per-step closure on the raw reports as they come. */
  function run(params: object, T: number) {
    const model = new Model(params);
    const series = new BudgetSeries(256);
    let worst = 0;
    while (model.time < T) {
      const r = model.step();
      const e = r.energy;
      const z = r.enstrophy;
      worst = Math.max(
        worst,
        Math.abs(e.transfer) / Math.max(e.injection, e.drag, e.hyper, e.largeScale),
        Math.abs(z.transfer) / Math.max(z.injection, z.drag, z.hyper, z.largeScale),
      );
      series.push(r);
    }
    return { model, series, worst };
  }

  // The cheap configuration: 32², ε = 1, μ = 1 (spin-up time 1/(2μ) = 0.5), forcing at k_f = 5 ± 1.5,
  // order-4 hyperviscosity at the grid scale, β = 5; 3850 steps at CFL 0.5, about 1.5 s. Mean from
  // t = 4 to 80 (measured: ⟨E⟩ = 0.491 ± 0.009 against ε/(2μ) = 0.5; ⟨loss⟩ = 1.006 ± 0.019 against
  // ε = 1; ε_ν/ε = 2.4%; U_rms = 0.991 against (ε/μ)^½ = 1; worst per-step residual 2.8e-16).
  const base = {
    nx: 32,
    ny: 32,
    beta: 5,
    kd: 0,
    mu: 1,
    nu: 2 / Math.pow(10, 8),
    nu_order: 4,
    mu_ls: 0,
    k_ls: 0,
    forcing: 'stochastic',
    kf: 5,
    dkf: 1.5,
    eps: 1,
    cfl: 0.5,
    dt: 0.05,
    seed: 7,
    init_energy: 0,
  };

  it('closes the budget to round-off at every step and balances ε = 2μ⟨E⟩ + ε_ν in the mean', () => {
    const { model, series, worst } = run(base, 80);
    // [derived] lib/model/budget.ts: transfer is the residual, zero to round-off (observed ~3e-16).
    expect(worst).toBeLessThan(1e-13);
    const c = series.columns();
    for (let i = 0; i < c.time.length; i++) expect(c.energy.transferMax[i]).toBeLessThan(1e-13 * c.energy.loss[i]);
    const m = series.timeMean(4);
    expect(m.duration).toBeGreaterThan(75);
    const e = m.energy;
    const eps = model.params.eps;
    const mu = model.params.mu;
    expect(e.injection.mean).toBeCloseTo(eps, 12); // the ensemble-mean rate of white-in-time forcing
    // The drag on ζ removes 2μ·KE, step by step, so also in the mean (k_d = 0: KE = E).
    expect(Math.abs(e.drag.mean - 2 * mu * m.kinetic.mean)).toBeLessThan(1e-13 * e.drag.mean);
    expect(Math.abs(m.kinetic.mean - e.value.mean)).toBeLessThan(1e-13 * e.value.mean);
    // ε = 2μ⟨E⟩ + ε_ν [derived] CHECKS (energy equation), within 3 batch-means standard errors.
    expect(e.loss.stdErr).toBeGreaterThan(0);
    expect(Math.abs(e.loss.mean - eps)).toBeLessThan(3 * e.loss.stdErr);
    // E → ε/(2μ) and U_rms → (ε/μ)^½ when ε_ν is small [derived] CHECKS: here ε_ν/ε is a few per cent,
    // so ⟨E⟩ is ε/(2μ) to within that and the sampling error.
    const hyperShare = e.hyper.mean / eps;
    expect(hyperShare).toBeGreaterThan(0);
    expect(hyperShare).toBeLessThan(0.05);
    expect(Math.abs(e.value.mean - eps / (2 * mu))).toBeLessThan(hyperShare * (eps / (2 * mu)) + 3 * e.value.stdErr);
    const U = Math.sqrt(2 * m.kinetic.mean);
    expect(Math.abs(U / balanceVelocity(eps, mu) - 1)).toBeLessThan(hyperShare + (3 * e.value.stdErr) / e.value.mean);
    // The enstrophy budget balances too: η = ⟨drag + hyper⟩ within 3 standard errors.
    const z = m.enstrophy;
    expect(Math.abs(z.loss.mean - z.injection.mean)).toBeLessThan(3 * z.loss.stdErr);
  });

  it('balances ε = 2μ⟨KE⟩ + ε_ν + ε_ls with large-scale drag and a deformation radius', () => {
    const { model, series, worst } = run({ ...base, kd: 1.5, mu_ls: 0.3, k_ls: 2.5, seed: 11 }, 40);
    expect(worst).toBeLessThan(1e-13);
    const m = series.timeMean(4);
    const e = m.energy;
    expect(e.largeScale.mean).toBeGreaterThan(0);
    // Drag on ζ: the energy loss is 2μ·KE (not 2μE) when k_d > 0.
    expect(Math.abs(e.drag.mean - 2 * model.params.mu * m.kinetic.mean)).toBeLessThan(1e-13 * e.drag.mean);
    expect(m.kinetic.mean).toBeLessThan(e.value.mean);
    expect(Math.abs(e.drag.mean + e.hyper.mean + e.largeScale.mean - model.params.eps)).toBeLessThan(3 * e.loss.stdErr);
  });
});
