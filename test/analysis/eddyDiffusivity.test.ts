import { describe, expect, it } from 'vitest';
import { eddyDiffusivity } from '../../lib/analysis/eddyDiffusivity';
import { ZonalMeanPlan } from '../../lib/analysis/zonalMean';
import { maxAbs } from '../support/random';
import { randomGridFields } from '../support/randomFields';

const n = 128;
const Ly = 2 * Math.PI;
const y = Float64Array.from({ length: n }, (_, j) => (j * Ly) / n);

// Flux-gradient closure D = −v′q′/∂y q̄ [published] Taylor, Phil. Trans. R. Soc. A 215, 1 (1915)
// (mixing length); Vallis 2017 (CHECKS).
describe('eddy diffusivity', () => {
  it('recovers a prescribed D(y) where the flux is −D ∂y q̄_tot, and the least-squares bulk D', () => {
    const beta = 2;
    const dqdy = y.map((s) => beta * (1 + 0.5 * Math.cos(3 * s))); // never small
    const D0 = y.map((s) => 0.3 + 0.1 * Math.sin(2 * s));
    const vpqp = D0.map((d, j) => -d * dqdy[j]);
    const eke = new Float64Array(n).fill(0.125); // U′ = (2·EKE)^½ = 0.5
    const r = eddyDiffusivity(vpqp, dqdy, eke);
    expect(r.validCount).toBe(n);
    for (let j = 0; j < n; j++) expect(Math.abs(r.D[j] - D0[j])).toBeLessThan(4 * Number.EPSILON * D0[j]);
    expect(r.Dmean).toBeCloseTo(0.3, 14);
    // D_fit = ⟨D0 g²⟩/⟨g²⟩, computed directly.
    const g2 = dqdy.reduce((a, g) => a + g * g, 0);
    const ref = dqdy.reduce((a, g, j) => a + D0[j] * g * g, 0) / g2;
    expect(r.Dfit!).toBeCloseTo(ref, 14);
    expect(r.Urms).toBeCloseTo(0.5, 15);
    expect(r.Lmix!).toBeCloseTo(ref / 0.5, 14);
  });

  it('masks points where the gradient is small: finite output, a validity mask, means over valid points only', () => {
    const dqdy = y.map((s) => 0.3 + Math.cos(s)); // crosses zero twice
    dqdy[17] = 0; // and one exact zero
    const vpqp = dqdy.map((g) => -0.7 * g + 1e-3); // a small non-closure part makes D blow up near g = 0
    const r = eddyDiffusivity(vpqp, dqdy, new Float64Array(n).fill(1), { floor: 0.2 });
    expect(r.floor).toBe(0.2);
    for (let j = 0; j < n; j++) {
      expect(Number.isFinite(r.D[j])).toBe(true);
      expect(r.valid[j]).toBe(Math.abs(dqdy[j]) >= 0.2 ? 1 : 0);
      if (!r.valid[j]) expect(r.D[j]).toBe(0);
    }
    expect(r.valid[17]).toBe(0);
    expect(r.validCount).toBeGreaterThan(n / 2);
    expect(r.validCount).toBeLessThan(n);
    let s = 0;
    for (let j = 0; j < n; j++) if (r.valid[j]) s += -vpqp[j] / dqdy[j];
    expect(r.Dmean).toBeCloseTo(s / r.validCount, 13);
    // Default floor: 0.1 of the rms gradient.
    const rms = Math.sqrt(dqdy.reduce((a, g) => a + g * g, 0) / n);
    expect(eddyDiffusivity(vpqp, dqdy, new Float64Array(n)).floor).toBeCloseTo(0.1 * rms, 15);
  });

  it('writes into given outputs and reports null means when nothing is valid', () => {
    const out = { D: new Float64Array(n), valid: new Uint8Array(n) };
    const r = eddyDiffusivity(new Float64Array(n), new Float64Array(n), new Float64Array(n), {}, out);
    expect(r.D).toBe(out.D);
    expect(r.validCount).toBe(0);
    expect(r.Dmean).toBeNull();
    expect(r.Dfit).toBeNull();
    expect(r.Lmix).toBeNull();
    expect(() => eddyDiffusivity(new Float64Array(n), new Float64Array(n - 1), new Float64Array(n))).toThrow(
      RangeError,
    );
  });

  // Why no flux-weighted bulk −⟨v′q′⟩/⟨∂y q̄⟩: the domain mean of v′q′ = −∂y(u′v′) vanishes on any
  // periodic field (Taylor identity [published] Taylor 1915; Vallis 2017) [derived].
  it('has ⟨v′q′⟩ = 0 to round-off on random periodic fields, so the flux-weighted ratio is void', () => {
    const f = randomGridFields({ nx: 64, ny: 64, Lx: 2 * Math.PI, Ly, kd: 2, maxIx: 21, maxM: 21, seed: 8 });
    const z = new ZonalMeanPlan(f, { beta: 5, band: 21 }).compute(f);
    const mean = z.vpqp.reduce((a, b) => a + b, 0) / 64;
    expect(Math.abs(mean)).toBeLessThan(1e-13 * maxAbs(z.vpqp));
    expect(maxAbs(z.vpqp)).toBeGreaterThan(1e-2);
    const r = eddyDiffusivity(z.vpqp, z.dqdy, z.eke);
    expect(Number.isFinite(r.Dfit!)).toBe(true);
  });
});
