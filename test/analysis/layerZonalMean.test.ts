import { describe, expect, it } from 'vitest';
import { LayerSnapshotPlan } from '../../lib/analysis/layerSnapshot';
import { LayerZonalMeanPlan } from '../../lib/analysis/layerZonalMean';
import { Model } from '../../lib/model/model';
import { twoLayerCoefficients, type ModelParams } from '../../lib/model/params';
import { validateParams } from '../../lib/model/validateParams';
import { maxAbs, maxAbsDiff } from '../support/random';
import { randomTwoLayerState } from '../support/twoLayerFixtures';

/** Round-off of sums of nx products followed by a length-ny transform pair, relative to their scale. */
const ROUND_OFF = 1e-13;

function setup(p: Partial<ModelParams>, band?: number) {
  const params = validateParams({ forcing: 'none', layers: 2, ...p });
  const snap = new LayerSnapshotPlan(params);
  const c = twoLayerCoefficients(params);
  const plan = new LayerZonalMeanPlan(snap.grid, { h1: c.h1, h2: c.h2, Q1: c.Q1, Q2: c.Q2, band });
  return { params, snap, plan, c };
}

/** The zonal mean, row by row, of the product of the deviations of a and b. */
function eddyProduct(a: Float64Array, b: Float64Array, nx: number, ny: number): Float64Array {
  const out = new Float64Array(ny);
  for (let j = 0; j < ny; j++) {
    let sa = 0,
      sb = 0;
    for (let i = 0; i < nx; i++) {
      sa += a[j * nx + i];
      sb += b[j * nx + i];
    }
    let s = 0;
    for (let i = 0; i < nx; i++) s += (a[j * nx + i] - sa / nx) * (b[j * nx + i] - sb / nx);
    out[j] = s / nx;
  }
  return out;
}

// Taylor identity in layer form [published: Taylor, Phil. Trans. R. Soc. A 215, 1 (1915); Vallis
// 2017, wave–mean-flow and baroclinic-instability chapters; the layer form derived in
// docs/two-layer.md]: Σ_i h_i (v′q′)_i = −∂y Σ_i h_i (u′v′)_i, the interface form stresses F_i(v_i′ψ_j′)
// cancelling in the depth-weighted sum (F₁h₁ = F₂h₂), to round-off on any periodic fields.
describe('layer zonal means', () => {
  for (const depthRatio of [1, 0.3, 4]) {
    it(`hold the layer form of the Taylor identity to round-off (δ = ${depthRatio}, fields with |m| < ny/4)`, () => {
      const { snap, plan, c } = setup({ nx: 64, ny: 64, Ly: 3, kd: 5, depth_ratio: depthRatio, beta: 2, shear: 0.7 });
      const q = randomTwoLayerState(snap.grid, 11, 1, 15);
      const up = snap.gridFields(q, 'upper');
      const lo = snap.gridFields(q, 'lower');
      const z = plan.compute(up, lo);
      const scale = maxAbs(z.upper.vpqp);
      expect(scale).toBeGreaterThan(1e-3);
      expect(maxAbsDiff(z.vpqp, z.convUpvp)).toBeLessThan(ROUND_OFF * scale);
      // Each layer alone misses by its interface form stress F_i (v_i′ψ_j′), which is not small.
      const form1 = eddyProduct(up.v, lo.psi, 64, 64).map((x) => c.F1 * x);
      const form2 = eddyProduct(lo.v, up.psi, 64, 64).map((x) => c.F2 * x);
      expect(maxAbs(form1)).toBeGreaterThan(0.1 * scale);
      expect(
        maxAbsDiff(
          z.upper.vpqp,
          z.upper.convUpvp.map((x, j) => x + form1[j]),
        ),
      ).toBeLessThan(ROUND_OFF * scale);
      expect(
        maxAbsDiff(
          z.lower.vpqp,
          z.lower.convUpvp.map((x, j) => x + form2[j]),
        ),
      ).toBeLessThan(ROUND_OFF * scale);
      // The layers' total PV gradients: Q_i + ∂y q̄_i.
      expect(z.upper.dqdy.reduce((s, x) => s + x, 0) / 64).toBeCloseTo(c.Q1, 12);
      expect(z.lower.dqdy.reduce((s, x) => s + x, 0) / 64).toBeCloseTo(c.Q2, 12);
    });
  }

  it('hold it on a 2/3-dealiased state in the kept band, and give the model’s heat flux', () => {
    const { params, snap, plan } = setup({ nx: 64, ny: 64, kd: 4, depth_ratio: 0.5, beta: 1, shear: 0.5 }, 21);
    const q = randomTwoLayerState(snap.grid, 5);
    const z = plan.compute(snap.gridFields(q, 'upper'), snap.gridFields(q, 'lower'));
    expect(maxAbsDiff(z.vpqp, z.convUpvp)).toBeLessThan(ROUND_OFF * maxAbs(z.upper.vpqp));
    // The domain mean of (v′τ′)‾ is the heat flux of the model's step report.
    const m = new Model(params);
    m.setState(q);
    const r = m.step();
    const mean = z.heatFlux.reduce((s, x) => s + x, 0) / 64;
    expect(Math.abs(mean / r.layers!.heatFlux - 1)).toBeLessThan(1e-12);
  });

  it('refuse one-layer parameters and states of the wrong size', () => {
    expect(() => new LayerSnapshotPlan(validateParams({}))).toThrow(/one-layer/);
    const { snap } = setup({ nx: 32, ny: 32, kd: 2, kf: 8 });
    expect(() => snap.field(new Float64Array(10), 'u', 'upper')).toThrow(/two-layer state/);
  });
});
