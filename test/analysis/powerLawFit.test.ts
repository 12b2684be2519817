import { describe, expect, it } from 'vitest';
import {
  INVERSE_CASCADE_CONSTANT,
  ZONAL_SPECTRUM_CONSTANT,
  anchoredLine,
  enstrophyCascadeSpectrum,
  fitPowerLaw,
  inverseCascadeSpectrum,
  zonalCrossover,
  zonalSpectrum,
} from '../../lib/analysis/powerLawFit';
import { transitionalWavenumber } from '../../lib/analysis/scales';
import { seededSigned } from '../support/random';

/**
 * Seeded standard normal deviates (Box–Muller on the seeded uniform source). The first uniform of a
 * small seed sits near 1 for every seed, so it is dropped.
 */
function seededNormal(seed: number): () => number {
  const next = seededSigned(seed);
  next();
  return () => {
    const u1 = 1 - (next() + 1) / 2; // (0, 1]
    const u2 = (next() + 1) / 2;
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
  };
}

/** E = A k^α e^{σξ} on n log-spaced k in [k0, k1], ξ from `gauss`. */
function noisyPowerLaw(
  alpha: number,
  A: number,
  sigma: number,
  n: number,
  k0: number,
  k1: number,
  gauss: () => number,
) {
  const k = new Float64Array(n);
  const E = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    k[i] = k0 * Math.pow(k1 / k0, i / (n - 1));
    E[i] = A * Math.pow(k[i], alpha) * Math.exp(sigma * gauss());
  }
  return { k, E };
}

describe('fitPowerLaw', () => {
  it('recovers an exact power law to round-off', () => {
    const k = Float64Array.from({ length: 30 }, (_, i) => i + 1);
    const E = k.map((x) => 0.37 * Math.pow(x, -5 / 3));
    const f = fitPowerLaw(k, E, 1, 30);
    expect(Math.abs(f.slope + 5 / 3)).toBeLessThan(1e-13);
    expect(Math.abs(f.prefactor / 0.37 - 1)).toBeLessThan(1e-13);
    expect(f.slopeStdErr).toBeLessThan(1e-13);
    expect(f.n).toBe(30);
  });

  it('uses only the band, and skips non-positive values in it', () => {
    const k = Float64Array.from({ length: 40 }, (_, i) => i + 1);
    const E = k.map((x) => (x < 10 ? 1e6 * x : 2 * Math.pow(x, -3)));
    E[19] = 0;
    E[24] = -1;
    const f = fitPowerLaw(k, E, 10, 40);
    expect(f.n).toBe(29);
    expect(f.skipped).toBe(2);
    expect(Math.abs(f.slope + 3)).toBeLessThan(1e-13);
    expect(() => fitPowerLaw(k, E, 10.5, 12.5)).toThrow(RangeError);
  });

  // Inverse cascade −5/3, enstrophy cascade −3, zonal −5 (CHECKS: Kraichnan 1967; Galperin et al. 2001).
  for (const alpha of [-5 / 3, -3, -5]) {
    it(`recovers slope ${alpha.toFixed(3)} from a seeded noisy power law within 3 standard errors`, () => {
      const { k, E } = noisyPowerLaw(alpha, 2.5, 0.3, 24, 3, 40, seededNormal(101 + Math.round(-alpha * 10)));
      const f = fitPowerLaw(k, E, 3, 40);
      expect(f.slopeStdErr).toBeGreaterThan(0.02);
      expect(Math.abs(f.slope - alpha)).toBeLessThan(3 * f.slopeStdErr);
      expect(Math.abs(Math.log(f.prefactor / 2.5))).toBeLessThan(3 * f.logPrefactorStdErr);
      // The pivot sits at the geometric-mean k of the points.
      expect(Math.abs(f.pivotK / Math.exp(k.reduce((s, x) => s + Math.log(x), 0) / k.length) - 1)).toBeLessThan(1e-14);
    });
  }

  it('reports a standard error that matches the scatter of slopes over many seeds', () => {
    // For n = 20 points, |t_18| ≤ 1 with probability 0.669; 400 trials give ±0.024 (1σ) on that.
    // One stream for all trials: nearby seeds of the test source start alike.
    const gauss = seededNormal(5);
    const trials = 400;
    let inside = 0;
    let meanSe = 0;
    let sq = 0;
    for (let t = 0; t < trials; t++) {
      const { k, E } = noisyPowerLaw(-3, 1, 0.2, 20, 5, 50, gauss);
      const f = fitPowerLaw(k, E, 5, 50);
      if (Math.abs(f.slope + 3) <= f.slopeStdErr) inside++;
      meanSe += f.slopeStdErr / trials;
      sq += ((f.slope + 3) * (f.slope + 3)) / trials;
    }
    expect(Math.abs(inside / trials - 0.669)).toBeLessThan(0.08);
    // The spread of the fitted slopes agrees with the mean reported error (E s ≈ σ for 18 dof).
    expect(Math.abs(Math.sqrt(sq) / meanSe - 1)).toBeLessThan(0.12);
  });
});

describe('reference lines', () => {
  it('inverse cascade E = C_K ε^{2/3} k^{−5/3}, C_K ≈ 6 (range 5.5–7) [memory]', () => {
    expect(INVERSE_CASCADE_CONSTANT).toBeGreaterThanOrEqual(5.5);
    expect(INVERSE_CASCADE_CONSTANT).toBeLessThanOrEqual(7);
    // 8^{5/3} = 32, (1e-3)^{2/3} = 1e-2.
    expect(Math.abs(inverseCascadeSpectrum(8, 1e-3) / (6e-2 / 32) - 1)).toBeLessThan(1e-14);
    expect(Math.abs(inverseCascadeSpectrum(8, 1e-3, 5) / (5e-2 / 32) - 1)).toBeLessThan(1e-14);
  });

  it('enstrophy cascade E ∝ η^{2/3} k^{−3} [published] Kraichnan, Phys. Fluids 10, 1417 (1967); Batchelor 1969', () => {
    expect(Math.abs(enstrophyCascadeSpectrum(2, 8, 1.5) / ((1.5 * 4) / 8) - 1)).toBeLessThan(1e-14);
    // The form: doubling k divides by 8; multiplying η by 8 multiplies by 4.
    expect(Math.abs(enstrophyCascadeSpectrum(6, 0.3, 1) / enstrophyCascadeSpectrum(3, 0.3, 1) - 1 / 8)).toBeLessThan(
      1e-15,
    );
    expect(Math.abs(enstrophyCascadeSpectrum(3, 2.4, 1) / enstrophyCascadeSpectrum(3, 0.3, 1) - 4)).toBeLessThan(1e-14);
  });

  // Zonal spectrum E_Z(m) = C_Z β² m^{−5} [published form] Galperin et al., Phys. Fluids 13, 1545 (2001);
  // C_Z ≈ 0.5 [value from memory: factor-of-2 tolerance].
  it('zonal spectrum E_Z = C_Z β² m^{−5} with C_Z ≈ 0.5', () => {
    expect(ZONAL_SPECTRUM_CONSTANT).toBeGreaterThanOrEqual(0.25);
    expect(ZONAL_SPECTRUM_CONSTANT).toBeLessThanOrEqual(1);
    expect(Math.abs(zonalSpectrum(2, 10) / (50 / 32) - 1)).toBeLessThan(1e-14);
  });

  // [derived] docs/spectra.md: the lines cross at (C_Z/C_K)^{3/10} k_β, k_β = (β³/ε)^{1/5} [published]
  // Vallis & Maltrud, J. Phys. Oceanogr. 23, 1346 (1993).
  it('zonal and inverse-cascade lines cross at (C_Z/C_K)^{3/10} k_β', () => {
    const [beta, eps] = [10, 1e-3];
    const kc = zonalCrossover(beta, eps);
    expect(Math.abs(zonalSpectrum(kc, beta) / inverseCascadeSpectrum(kc, eps) - 1)).toBeLessThan(1e-13);
    expect(Math.abs(kc / (Math.pow(0.5 / 6, 0.3) * transitionalWavenumber(beta, eps)) - 1)).toBeLessThan(1e-14);
  });

  it('an anchored line passes through its anchor with its slope', () => {
    const k = Float64Array.from([1, 2, 4, 8]);
    const out = new Float64Array(4);
    expect(anchoredLine(k, -3, 2, 5, out)).toBe(out);
    expect(Array.from(out)).toEqual([40, 5, 5 / 8, 5 / 64]);
  });
});
