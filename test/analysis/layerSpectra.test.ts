import { describe, expect, it } from 'vitest';
import { LayerSpectraPlan } from '../../lib/analysis/layerSpectra';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';

/** A baroclinically unstable flow of the test's own, 64², spun up to finite amplitude. */
const TURBULENT: Partial<ModelParams> = {
  layers: 2,
  nx: 64,
  ny: 64,
  kd: 6,
  depth_ratio: 0.6,
  beta: 1.5,
  shear: 0.6,
  mu: 0.1,
  nu: 1e-9,
  nu_order: 4,
  forcing: 'none',
  dt: 0.05,
  cfl: 0.6,
  init_energy: 0.002,
  kf: 12,
  dkf: 2,
};

const sum = (a: Float64Array) => a.reduce((s, x) => s + x, 0);

describe('barotropic and baroclinic spectra and spectral fluxes', () => {
  const m = new Model(TURBULENT);
  m.step(400);
  const plan = new LayerSpectraPlan(m.params);
  const out = plan.compute(m.qHat);
  const r = m.step(); // the report of the state just analysed

  // The shells hold the reservoirs of the energy cycle: Σ over shells = KE_bt, KE_bc, APE of the
  // model's own step report [derived: docs/two-layer.md, "The energy cycle"; Parseval as in spectra.ts].
  it('sum over the shells to the energy cycle reservoirs of the step report', () => {
    const c = r.layers!;
    expect(Math.abs(sum(out.kineticBarotropic) / c.kineticBarotropic - 1)).toBeLessThan(1e-12);
    expect(Math.abs(sum(out.kineticBaroclinic) / c.kineticBaroclinic - 1)).toBeLessThan(1e-12);
    expect(Math.abs(sum(out.potential) / c.potential - 1)).toBeLessThan(1e-12);
  });

  // The truncated Jacobian conserves energy [published: Kraichnan 1967; practice for Galerkin
  // models]: the total flux vanishes above the last kept shell, and the barotropic triads alone
  // conserve the barotropic energy, so Π_bt vanishes there too.
  it('has fluxes that vanish above the last kept shell, to round-off', () => {
    const top = plan.shells.keptShells - 1;
    expect(Math.abs(out.netTransfer)).toBeLessThan(1e-13 * out.grossTransfer);
    expect(Math.abs(out.flux[top])).toBeLessThan(1e-13 * out.grossTransfer);
    expect(Math.abs(out.fluxBarotropic[top])).toBeLessThan(1e-13 * out.grossTransfer);
    expect(Math.abs(out.fluxBaroclinic[top])).toBeLessThan(1e-13 * out.grossTransfer);
    for (let s = 0; s < out.k.length; s++)
      expect(out.flux[s]).toBeCloseTo(out.fluxBarotropic[s] + out.fluxBaroclinic[s], 14);
  });

  // The eddies' exchange plus the shear's linear term is the cycle's barotropic transfer T
  // [derived: docs/two-layer.md]; the linear term on the grid, dE_bt = −h₁h₂(U₁ − U₂)⟨v_bt ∇²τ⟩,
  // from the model's own fields, so this also checks the table's first row independently.
  it('gives the eddies’ share of the barotropic transfer', () => {
    const p = m.params;
    const [h1, h2] = [p.depth_ratio / (1 + p.depth_ratio), 1 / (1 + p.depth_ratio)];
    const m2 = new Model(TURBULENT);
    m2.step(400);
    const vbt = m2.field('v', undefined, 'barotropic');
    const lapTau = m2.field('zeta', undefined, 'baroclinic');
    let s = 0;
    for (let i = 0; i < vbt.length; i++) s += vbt[i] * lapTau[i];
    const linear = (-h1 * h2 * p.shear * s) / vbt.length;
    const T = r.layers!.barotropicTransfer;
    expect(Math.abs(out.netExchange + linear - T)).toBeLessThan(1e-11 * (Math.abs(T) + Math.abs(linear)));
    // Baroclinic turbulence: the eddies feed the barotropic mode, which sends its energy to large
    // scales (an inverse flux below the deformation wavenumber) [practice; Salmon 1980 [memory]].
    expect(out.netExchange).toBeGreaterThan(0);
    const kd = p.kd;
    const below = out.kEdge.findIndex((k) => k > kd / 2) - 1;
    expect(out.fluxBarotropic[below]).toBeLessThan(0);
  });
});
