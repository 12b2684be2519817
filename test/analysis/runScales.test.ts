import { describe, expect, it } from 'vitest';
import { RunScalesPlan, runScales } from '../../lib/analysis/runScales';
import { RHINES_DEFINITIONS, rhinesWavenumber } from '../../lib/analysis/scales';
import { SnapshotPlan } from '../../lib/analysis/snapshot';
import { Model } from '../../lib/model/model';
import { DEFAULT_PARAMS, type ModelParams } from '../../lib/model/params';
import { randomKeptState, sampleGrid, spectrumOf } from '../support/modelFixtures';

/** q̂ of ψ = A cos(3x + 4y) on the grid of p, with A set so that U_rms = ⟨u² + v²⟩^½ = U. */
function stateOfSpeed(p: ModelParams, U: number): Float64Array {
  // ⟨u² + v²⟩ = A²|k|²/2 with |k| = 5.
  const A = (U * Math.SQRT2) / 5;
  const psiHat = spectrumOf(p, sampleGrid(p, (x, y) => A * Math.cos(3 * x + 4 * y)));
  const q = new Float64Array(psiHat.length);
  const K2 = 25 + p.kd * p.kd;
  for (let i = 0; i < q.length; i++) q[i] = -K2 * psiHat[i];
  return q;
}

describe('runScales', () => {
  it('measures U_rms as ⟨u² + v²⟩^½ of the gridded velocity (k_d ≠ 0)', () => {
    const model = new Model({ ...DEFAULT_PARAMS, nx: 64, ny: 32, Ly: Math.PI, kd: 2, forcing: 'none' });
    model.setState(randomKeptState(model, 5, 3));
    const snap = new SnapshotPlan(model.params);
    const f = snap.gridFields(model.qHat);
    let s = 0;
    for (let i = 0; i < f.u.length; i++) s += f.u[i] * f.u[i] + f.v[i] * f.v[i];
    const plan = new RunScalesPlan(model.params, snap);
    expect(Math.abs(plan.rmsVelocity(model.qHat) / Math.sqrt(s / f.u.length) - 1)).toBeLessThan(1e-13);
  });

  // Worked example [derived] (CHECKS): β = 10, ε = μ = 1e-3 → U = 1, k_β = 15.8489, k_R = 2.23607,
  // R_β = 7.08786. k_R [published] Rhines, J. Fluid Mech. 69, 417 (1975); k_β [published] Vallis &
  // Maltrud, J. Phys. Oceanogr. 23, 1346 (1993); R_β and the regime thresholds [published] Sukoriansky
  // et al. 2007, Galperin et al. 2010 [memory for the thresholds]; k_fric [published] Smith et al. 2002
  // [memory for the exact form].
  it('reproduces the worked example through a state with U_rms = 1', () => {
    const p: ModelParams = { ...DEFAULT_PARAMS, nx: 64, ny: 64, beta: 10, eps: 1e-3, mu: 1e-3, kf: 12, dkf: 1.5, nu: 1e-12, nu_order: 4 };
    const r = runScales({ params: p, time: 3, steps: 7, qHat: stateOfSpeed(p, 1) });
    expect(Math.abs(r.U_rms - 1)).toBeLessThan(1e-14);
    expect(r.scales.rhines.k).toBeCloseTo(2.23607, 5);
    expect(r.scales.transitional.k).toBeCloseTo(15.8489, 4);
    expect(r.R_beta).toBeCloseTo(7.08786, 5);
    expect(r.regime).toBe('zonostrophic');
    expect(r.scales.friction.k).toBeCloseTo(1e-3, 15);
    expect(r.scales.forcing.k).toBe(12);
    expect(r.scales.deformation.k).toBeNull(); // k_d = 0: no finite deformation radius
    expect(r.scales.domain.k).toBeCloseTo(1, 15);
    expect(r.scales.grid.k).toBe(21);
    expect(r.scales.rhines.length).toBeCloseTo((2 * Math.PI) / 2.23607, 4);
    expect([r.time, r.steps]).toEqual([3, 7]);
    // Ascending order, for the ladder.
    const ks = r.ladder.map((e) => e.k ?? Infinity);
    for (let i = 1; i < ks.length; i++) expect(ks[i]).toBeGreaterThanOrEqual(ks[i - 1]);
    expect(r.ladder[r.ladder.length - 1].id).toBe('deformation');
  });

  it('labels the chosen Rhines convention and keeps R_β on k_R', () => {
    const p: ModelParams = { ...DEFAULT_PARAMS, nx: 32, ny: 32, beta: 3, eps: 0.02, mu: 0.05, kd: 0.5 };
    const q = stateOfSpeed(p, 0.7);
    const plan = new RunScalesPlan(p);
    const base = plan.measure({ params: p, time: 0, steps: 0, qHat: q });
    const kR = rhinesWavenumber(3, 0.7);
    expect(Math.abs((base.scales.rhines.k as number) / kR - 1)).toBeLessThan(1e-14);
    for (const id of ['sqrtUbeta', 'piOverKR', 'twoPiSqrtUbeta'] as const) {
      const r = plan.measure({ params: p, time: 0, steps: 0, qHat: q }, id);
      expect(r.rhinesConvention).toBe(id);
      expect(r.scales.rhines.label).toContain(RHINES_DEFINITIONS[id].label);
      expect(Math.abs((r.scales.rhines.length as number) / RHINES_DEFINITIONS[id].length(3, 0.7) - 1)).toBeLessThan(1e-14);
      expect(r.R_beta).toBe(base.R_beta);
    }
    // π/k_R puts the Rhines length at k = 2 k_R [published/memory for who uses which] (CHECKS).
    const pi = plan.measure({ params: p, time: 0, steps: 0, qHat: q }, 'piOverKR');
    expect(Math.abs((pi.scales.rhines.k as number) / (2 * kR) - 1)).toBeLessThan(1e-14);
    expect(pi.scales.deformation.k).toBe(0.5);
  });

  // η = σ² N_list for white-in-time forcing, the model's own ensemble-mean enstrophy injection
  // [published] Novikov 1965; ring normalisation as in Srinivasan & Young 2012 [memory]; η ≈ k_f² ε.
  it('uses the enstrophy injection of the forced annulus for the dissipation wavenumber', () => {
    const params = { ...DEFAULT_PARAMS, nx: 64, ny: 64, kf: 10, dkf: 1, eps: 0.5, nu: 1e-11, nu_order: 4 };
    const model = new Model(params);
    const report = model.step();
    const r = runScales({ params: model.params, time: model.time, steps: model.steps, qHat: model.qHat });
    expect(Math.abs(r.eta / report.enstrophy.injection - 1)).toBeLessThan(1e-13);
    expect(Math.abs(r.eta / (100 * 0.5) - 1)).toBeLessThan(0.02);
    expect(Math.abs((r.scales.dissipation.k as number) / Math.pow(Math.cbrt(r.eta) / 1e-11, 1 / 8) - 1)).toBeLessThan(1e-14);
  });

  it('leaves undefined scales null: no forcing, no motion', () => {
    const p: ModelParams = { ...DEFAULT_PARAMS, nx: 32, ny: 32, forcing: 'none' };
    const r = runScales({ params: p, time: 0, steps: 0, qHat: new Float64Array(2 * 32 * 17) });
    expect(r.U_rms).toBe(0);
    expect(r.scales.rhines.k).toBeNull();
    expect(r.scales.transitional.k).toBeNull();
    expect(r.scales.forcing.k).toBeNull();
    expect(r.R_beta).toBeNull();
    expect(r.regime).toBeNull();
    expect(JSON.parse(JSON.stringify(r)).scales.grid.k).toBe(10);
  });
});
