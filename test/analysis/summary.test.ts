import { describe, expect, it } from 'vitest';
import { RunMonitor } from '../../lib/analysis/runMonitor';
import { balanceVelocity, rhinesWavenumber, transitionalWavenumber } from '../../lib/analysis/scales';
import { SUMMARY_KEYS, summarize } from '../../lib/analysis/summary';
import { Model } from '../../lib/model/model';

/** Run a model, recording every step and sampling every `every` time units after `from`. */
function monitored(
  params: Record<string, unknown>,
  until: number,
  every: number,
  window?: { kind: 'since'; tStart: number },
) {
  const model = new Model(params);
  const mon = new RunMonitor(model.params, window ? { window } : {});
  let next = 0;
  while (model.time < until) {
    mon.step(model.step());
    if (model.time >= next) {
      mon.sample(model.qHat, model.time);
      next += every;
    }
  }
  return { model, mon, summary: summarize(mon, model.time, model.steps) };
}

describe('run summary', () => {
  // Linear-drag steady state: E = ε/(2μ), U_rms = (ε/μ)^½ when hyperviscous loss is small
  // [derived] from the energy equation (CHECKS: budgets and forcing).
  it('holds the stable keys and reproduces the drag balance of a short strongly damped run', () => {
    const { summary } = monitored(
      {
        nx: 32,
        ny: 32,
        beta: 4,
        mu: 1,
        eps: 1,
        kf: 5,
        dkf: 1,
        nu: 1e-9,
        nu_order: 4,
        dt: 0.02,
        cfl: 0.5,
        forcing: 'stochastic',
      },
      60,
      0.25,
      { kind: 'since', tStart: 5 },
    );
    for (const k of SUMMARY_KEYS) expect(summary).toHaveProperty(k);
    expect(JSON.parse(JSON.stringify(summary))).toEqual(summary);
    expect(summary.window_start).toBeGreaterThanOrEqual(5);
    // Sampling error of a 55-time-unit mean at μ = 1 is a few per cent; hyper loss is ~2%.
    expect(Math.abs(summary.u_rms! / balanceVelocity(1, 1) - 1)).toBeLessThan(0.05);
    expect(Math.abs(summary.energy! / 0.5 - 1)).toBeLessThan(0.06);
    expect(Math.abs(summary.injection! - 1)).toBeLessThan(1e-9); // the mean rate of white forcing is ε exactly
    expect(Math.abs((summary.drag_loss! + summary.hyper_loss!) / summary.injection! - 1)).toBeLessThan(0.05);
    // The scales follow from the measured U and ε by their definitions (Rhines 1975; Vallis & Maltrud 1993).
    expect(summary.k_rhines).toBeCloseTo(rhinesWavenumber(4, summary.u_rms!), 12);
    expect(summary.k_beta).toBeCloseTo(transitionalWavenumber(4, summary.injection!), 12);
    expect(summary.zonostrophy_index).toBeCloseTo(summary.k_beta! / summary.k_rhines!, 12);
  });

  it('is all nulls but the clock before anything is recorded, and null where β = 0', () => {
    const model = new Model({ nx: 32, ny: 32, kf: 5, dkf: 1, beta: 0, init_energy: 0.1 });
    const mon = new RunMonitor(model.params);
    const empty = summarize(mon, 0, 0);
    expect(empty.energy).toBeNull();
    expect(empty.jet_count).toBeNull();
    expect(empty.window_samples).toBe(0);
    mon.step(model.step());
    mon.sample(model.qHat, model.time);
    const s = summarize(mon, model.time, model.steps);
    expect(s.k_rhines).toBeNull();
    expect(s.staircase_index).toBeNull();
    expect(s.zonostrophy_index).toBeNull();
    expect(s.energy).toBeGreaterThan(0);
  });

  // Eddy-driven jets on the β-plane (CHECKS: eddy momentum flux convergence keeps eastward jets,
  // [practice]); a half-width channel with R_β ≈ 3.6 forms two jets by t ≈ 60 (seen in the zonal
  // diagnostics' own integration run).
  it('finds the jets of a zonostrophic run and a staircase above the plain gradient', () => {
    const { summary } = monitored(
      {
        nx: 32,
        ny: 64,
        Lx: Math.PI,
        Ly: 2 * Math.PI,
        beta: 10,
        kf: 12,
        dkf: 1.5,
        eps: 0.04,
        mu: 0.03,
        nu: 1e-10,
        nu_order: 4,
        cfl: 0.8,
        dt: 0.05,
        seed: 3,
      },
      120,
      0.5,
      { kind: 'since', tStart: 60 },
    );
    expect(summary.jet_count).toBeGreaterThanOrEqual(1);
    expect(summary.jet_spacing).toBeCloseTo((2 * Math.PI) / summary.jet_count!, 12);
    expect(summary.jet_verdict).toBe('jets');
    // The staircase stands above the plain gradient (S = 0) by more than twice its standard error.
    expect(summary.staircase_index!).toBeGreaterThan(2 * summary.staircase_index_stderr!);
    expect(summary.steady).toBe(true);
    expect(summary.regime).not.toBe('friction-dominated');
    // Every headline number carries its standard error (docs/significance.md).
    for (const k of ['u_rms_stderr', 'zonostrophy_index_stderr', 'jet_spacing_stderr'] as const)
      expect(summary[k]).toBeGreaterThan(0);
  });
});
