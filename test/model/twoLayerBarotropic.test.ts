import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';
import { maxAbs } from '../support/random';

/** Shared by both runs: no drag (it would act on the lower layer only), hyperviscosity, β. */
const COMMON: Partial<ModelParams> = {
  nx: 64,
  ny: 64,
  beta: 3,
  mu: 0,
  nu: 1e-8,
  nu_order: 3,
  kf: 10,
  dkf: 2,
  eps: 0.05,
  dt: 0.02,
};

// A barotropic state (q₁ = q₂) without shear or drag stays barotropic, and its flow is that of one
// layer with k_d = 0 [derived: with U₁ = U₂ and μ = 0 the layer equations are the same for both
// layers, q_i = ∇²ψ when ψ₁ = ψ₂, and F_i J(ψ_i, ψ_j) = 0; docs/two-layer.md]. Barotropic forcing
// (the same increment in both layers, the same draws as one layer) keeps it so. To round-off: the
// two runs differ only by the rounding of the 2 × 2 propagators and of h₁q₁ + h₂q₂.
describe('a barotropic two-layer flow is the one-layer flow with k_d = 0', () => {
  const cases: [string, Partial<ModelParams>][] = [
    ['equal layers, unforced, adaptive step', { depth_ratio: 1, forcing: 'none', cfl: 0.5 }],
    ['unequal layers, unforced', { depth_ratio: 0.4, forcing: 'none', cfl: 0 }],
    ['unequal layers, stochastic forcing in both layers', { depth_ratio: 2.5, forcing: 'stochastic', cfl: 0 }],
  ];
  for (const [what, p] of cases) {
    it(what, () => {
      const one = new Model({ ...COMMON, ...p, kd: 0, depth_ratio: 1, init_energy: 0.1 });
      const two = new Model({ ...COMMON, ...p, layers: 2, kd: 5, shear: 0 });
      const n = one.qHat.length;
      const both = new Float64Array(2 * n);
      both.set(one.qHat, 0);
      both.set(one.qHat, n);
      two.setState(both);
      for (let i = 0; i < 150; i++) {
        one.step();
        two.step();
        if (i % 30 === 29 || i === 149) {
          const scale = maxAbs(one.qHat);
          let worst = 0;
          for (let k = 0; k < n; k++)
            worst = Math.max(worst, Math.abs(two.qHat[k] - one.qHat[k]), Math.abs(two.qHat[n + k] - one.qHat[k]));
          expect(worst, `step ${i + 1}`).toBeLessThan(1e-12 * scale);
          expect(two.time).toBe(one.time);
          // Energy: all barotropic, no potential energy; the same as one layer's.
          expect(two.report.layers!.potential).toBeLessThan(1e-24 * two.report.energy.value);
          expect(Math.abs(two.report.energy.value / one.report.energy.value - 1)).toBeLessThan(1e-12);
        }
      }
    });
  }
});
