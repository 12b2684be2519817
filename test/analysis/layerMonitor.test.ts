import { describe, expect, it } from 'vitest';
import { eddyDiffusivity } from '../../lib/analysis/eddyDiffusivity';
import { flowMemory, RunMonitor } from '../../lib/analysis/runMonitor';
import { SUMMARY_KEYS, SUMMARY_TWO_LAYER_KEYS, summarize } from '../../lib/analysis/summary';
import type { StepReport } from '../../lib/model/budget';
import { Model } from '../../lib/model/model';
import { copyReport } from '../../lib/model/budget';
import { twoLayerCoefficients, type ModelParams } from '../../lib/model/params';
import { MonitoredRun } from '../../lib/run/monitoredRun';
import { resolveRunPlan } from '../../lib/run/runPlan';
import { stateFromJson, stateToJson } from '../../lib/run/stateJson';
import type { MonitoredRunState } from '../../lib/run/monitoredRun';

/** A baroclinically unstable flow of the test's own (64², supercritical, bottom drag, large-scale drag). */
const FLOW: Partial<ModelParams> = {
  layers: 2,
  nx: 64,
  ny: 64,
  kd: 6,
  depth_ratio: 0.6,
  beta: 1.5,
  shear: 0.25,
  mu: 0.2,
  nu: 1e-9,
  nu_order: 4,
  forcing: 'none',
  dt: 0.1,
  cfl: 0.6,
  init_energy: 0.002,
  kf: 12,
  dkf: 2,
};

function run(params: Partial<ModelParams>, until: number, from: number) {
  const model = new Model(params);
  const mon = new RunMonitor(model.params, { window: { kind: 'since', tStart: from } });
  const reports: StepReport[] = [];
  let next = 0;
  while (model.time < until) {
    const r = model.step();
    mon.step(r);
    reports.push(copyReport(r));
    if (model.time >= next) {
      mon.sample(model.qHat, model.time);
      next += 0.5;
    }
  }
  return { model, mon, reports, summary: summarize(mon, model.time, model.steps) };
}

describe('two-layer run monitor and summary', () => {
  const { model, mon, reports, summary } = run(FLOW, 45, 25);
  const c = twoLayerCoefficients(model.params);

  it('watches the barotropic flow with the bottom drag’s memory and keeps the layers', () => {
    // The barotropic vorticity equation carries −h₂μζ₂ [derived: docs/two-layer.md], so the memory
    // of the barotropic flow is 1/(μh₂); the staircase uses its mean PV gradient β.
    expect(flowMemory(model.params)).toBeCloseTo(1 / (0.2 * c.h2), 12);
    expect(mon.detector.memory).toBeCloseTo(1 / (0.2 * c.h2), 12);
    expect(mon.detector.beta).toBe(1.5);
    expect(mon.layers).not.toBeNull();
    // The barotropic ū is h₁ū₁ + h₂ū₂ of the layers' own zonal means.
    const z = mon.layers!.latest;
    for (let j = 0; j < 64; j++)
      expect(mon.latest.ubar[j]).toBeCloseTo(c.h1 * z.upper.ubar[j] + c.h2 * z.lower.ubar[j], 12);
  });

  it('summarises the two-layer keys as their definitions say', () => {
    for (const k of SUMMARY_KEYS) expect(summary).toHaveProperty(k);
    for (const k of SUMMARY_TWO_LAYER_KEYS) expect(summary[k], k).not.toBeNull();
    expect(summary.layers).toBe(2);
    // ξ = F₂(U₁ − U₂)/β, the shear over the Phillips critical shear β/F₂ [derived: docs/two-layer.md,
    // Pedlosky 1987 §7.11]; here F₂ = δk_d²/(1 + δ) = 13.5, ξ = 13.5 · 0.25/1.5 = 2.25.
    expect(summary.supercriticality).toBeCloseTo(2.25, 12);
    // The time means of the step reports over the window, recomputed here.
    let w = 0,
      heat = 0,
      keBt = 0;
    for (const r of reports) {
      const mid = r.time - r.dt / 2;
      if (mid < summary.window_start! || mid > summary.window_end!) continue;
      w += r.dt;
      heat += r.dt * r.layers!.heatFlux;
      keBt += r.dt * r.layers!.kineticBarotropic;
    }
    expect(Math.abs(summary.heat_flux! / (heat / w) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(summary.eddy_velocity! / Math.sqrt((2 * keBt) / w) - 1)).toBeLessThan(1e-12);
    // G = F₁h₁(U₁ − U₂)⟨vτ⟩ step by step, so in the mean [derived]; D = ⟨vτ⟩/(U₁ − U₂).
    expect(Math.abs(summary.energy_generation! / (c.F1 * c.h1 * 0.25 * summary.heat_flux!) - 1)).toBeLessThan(1e-12);
    expect(summary.eddy_diffusivity).toBeCloseTo(summary.heat_flux! / 0.25, 12);
    // Baroclinic eddies carry heat down the mean temperature gradient (poleward for U₁ > U₂) and so
    // draw on the mean APE [published: Vallis 2017, baroclinic-instability chapter; Pedlosky 1987].
    expect(summary.heat_flux).toBeGreaterThan(0);
    expect(summary.heat_flux_stderr).toBeGreaterThan(0);
    expect(summary.heat_flux_stderr).toBeLessThan(summary.heat_flux!);
    expect(summary.eddy_diffusivity_stderr).toBeCloseTo(summary.heat_flux_stderr! / 0.25, 12);
    expect(JSON.parse(JSON.stringify(summary))).toEqual(summary);
  });

  // The eddy PV diffusivity of each layer, D_i = −(v′q′)_i/∂y(q̄_i + Q_i y), with today's guard
  // (a gradient below a tenth of its rms is not divided by) [published: Taylor 1915; Vallis 2017].
  it('gives each layer’s eddy diffusivity with the guard of one layer', () => {
    mon.layers!.meanProfiles();
    const d = mon.layers!.diffusivities();
    const m = mon.layers!.mean;
    const ref = eddyDiffusivity(m.vpqp2, m.dqdy2, m.eke2);
    expect(Array.from(d.lower.D)).toEqual(Array.from(ref.D));
    for (const layer of [d.upper, d.lower]) {
      const dqdy = layer === d.upper ? m.dqdy1 : m.dqdy2;
      for (let j = 0; j < 64; j++) {
        expect(Number.isFinite(layer.D[j])).toBe(true);
        if (Math.abs(dqdy[j]) < layer.floor) expect([layer.valid[j], layer.D[j]]).toEqual([0, 0]);
      }
    }
    // The layers' mean PV gradients Q₁ = β + F₁ΔU > 0 and Q₂ = β − F₂ΔU < 0 (supercritical): the
    // eddies mix PV down each layer's gradient, so the bulk fits are positive [practice: the
    // flux-gradient picture of Held & Larichev 1996].
    expect(c.Q1).toBeGreaterThan(0);
    expect(c.Q2).toBeLessThan(0);
    expect(d.upper.Dfit).toBeGreaterThan(0);
    expect(d.lower.Dfit).toBeGreaterThan(0);
  });

  it('gives layers = 1 and null for the two-layer keys of a one-layer run', () => {
    const one = run({ nx: 32, ny: 32, beta: 4, mu: 1, eps: 1, kf: 5, dkf: 1, nu: 1e-9, nu_order: 4 }, 3, 1);
    expect(one.mon.layers).toBeNull();
    expect(one.summary.layers).toBe(1);
    for (const k of SUMMARY_TWO_LAYER_KEYS.filter((k) => k !== 'layers')) expect(one.summary[k], k).toBeNull();
  });

  it('saves and restores the layers’ measurement, through JSON, to the same summary', () => {
    const plan = (m: Model) => resolveRunPlan(m.params, { until: 6, sampleEvery: 0.25, average: 3 });
    const a = new Model(FLOW);
    const whole = new MonitoredRun(a, plan(a));
    whole.advance();
    const b = new Model(FLOW);
    const first = new MonitoredRun(b, plan(b));
    first.advance(70);
    const saved = stateFromJson(
      JSON.parse(JSON.stringify(stateToJson(first.saveState() as never))),
    ) as unknown as MonitoredRunState;
    expect(saved.monitor.layers).toBeDefined();
    const again = new MonitoredRun(Model.restore(b.checkpoint()), plan(b), {}, { time: 0, steps: 0 });
    again.restoreState(saved);
    again.advance();
    expect(JSON.stringify(again.summary())).toBe(JSON.stringify(whole.summary()));
    // A one-layer run refuses it.
    const one = new Model({ nx: 64, ny: 64, kf: 12 });
    const o = new MonitoredRun(one, resolveRunPlan(one.params, { steps: 5 }));
    expect(() => o.restoreState(saved)).toThrow(/monitor\.layers/);
  });
});
