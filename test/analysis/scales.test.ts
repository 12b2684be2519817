import { describe, expect, it } from 'vitest';
import {
  anisotropicBoundary,
  balanceVelocity,
  dissipationWavenumber,
  frictionWavenumber,
  regimeOf,
  rhinesLength,
  rhinesWavenumber,
  staircaseSpacing,
  steadyZonostrophyIndex,
  transitionalWavenumber,
  zonostrophyIndex,
} from '../../lib/analysis/scales';

describe('scales and regimes', () => {
  // Worked example [derived] (CHECKS): β = 10, ε = μ = 1e-3 → U = 1, k_β = 15.8489, k_R = 2.23607,
  // R_β = 7.08786. Definitions: k_R [published] Rhines, J. Fluid Mech. 69, 417 (1975); k_β [published]
  // Vallis & Maltrud, J. Phys. Oceanogr. 23, 1346 (1993); R_β [published] Sukoriansky, Dikovskaya &
  // Galperin, J. Atmos. Sci. 64, 3312 (2007).
  it('reproduces the worked example', () => {
    const U = balanceVelocity(1e-3, 1e-3);
    expect(U).toBe(1);
    const kb = transitionalWavenumber(10, 1e-3);
    const kr = rhinesWavenumber(10, U);
    expect(kb).toBeCloseTo(15.8489, 4);
    expect(kr).toBeCloseTo(2.23607, 5);
    expect(zonostrophyIndex(kb, kr)).toBeCloseTo(7.08786, 5);
    expect(steadyZonostrophyIndex(10, 1e-3, 1e-3)).toBeCloseTo(7.08786, 5);
  });

  // R_β = √2 (β²ε/μ⁵)^{1/20} in the linear-drag steady state [derived] (docs/scales.md).
  it('the steady-state closed form equals k_β/k_R at U = (ε/μ)^½ for any parameters', () => {
    for (const [b, e, m] of [
      [1, 1, 1],
      [37, 2e-5, 0.03],
      [1.6e-11, 1e-7, 1e-7],
    ]) {
      const direct = zonostrophyIndex(transitionalWavenumber(b, e), rhinesWavenumber(b, balanceVelocity(e, m)));
      expect(Math.abs(steadyZonostrophyIndex(b, e, m) / direct - 1)).toBeLessThan(1e-14);
    }
  });

  // The Rhines conventions differ by exact factors [published/memory for who uses which] (CHECKS).
  it('relates the Rhines conventions by their exact factors', () => {
    const [b, U] = [3.7, 0.42];
    const kr = rhinesWavenumber(b, U);
    const base = Math.sqrt(U / b);
    expect(rhinesLength(b, U, 'sqrtUbeta')).toBeCloseTo(base, 14);
    expect(rhinesLength(b, U, 'piOverKR') / base).toBeCloseTo(Math.PI * Math.SQRT2, 13);
    expect(rhinesLength(b, U, 'piOverKR')).toBeCloseTo(Math.PI / kr, 13);
    expect(rhinesLength(b, U, 'twoPiSqrtUbeta') / base).toBeCloseTo(2 * Math.PI, 13);
    expect(rhinesLength(b, U, 'kR')).toBeCloseTo((2 * Math.PI) / kr, 13);
  });

  // Staircase: L = 720^{1/4}(U_rms/β)^½ ≈ 5.1800 (U_rms/β)^½ and L/(2u_max/β)^½ = √6 with u_max = βL²/12
  // [published] Dritschel & McIntyre, J. Atmos. Sci. 65, 855 (2008); Dunkerton & Scott, J. Atmos. Sci.
  // 65, 1105 (2008); [derived] the factors.
  it('gives the staircase spacing factor 5.1800 and the √6 limit', () => {
    expect(staircaseSpacing(1, 1)).toBeCloseTo(5.18, 4);
    const [b, U] = [2, 0.3];
    const L = staircaseSpacing(b, U);
    const umax = (b * L * L) / 12;
    expect(L / Math.sqrt((2 * umax) / b)).toBeCloseTo(Math.sqrt(6), 13);
  });

  it('anisotropic boundary is k_β on the kx axis and vanishes on the ky axis', () => {
    // [published] Vallis & Maltrud 1993: k_β(θ) = k_β |cos θ|^{3/5}
    expect(anisotropicBoundary(10, 0)).toBe(10);
    expect(anisotropicBoundary(10, Math.PI / 2)).toBeLessThan(1e-8); // cos(π/2) is 6e-17 in floating point
    expect(anisotropicBoundary(10, Math.PI / 3)).toBeCloseTo(10 * Math.pow(0.5, 0.6), 12);
  });

  it('friction and dissipation wavenumbers follow their formulas', () => {
    // k_fric = (μ³/ε)^½ [published] Smith et al., J. Fluid Mech. 469, 13 (2002) [memory for the exact form]
    expect(frictionWavenumber(0.1, 1e-3)).toBeCloseTo(1, 12);
    // Kraichnan's k_ν = (η^{1/3}/ν)^{1/2} for p = 1 (common practice)
    expect(dissipationWavenumber(8, 0.5, 1)).toBeCloseTo(2, 12);
    expect(dissipationWavenumber(8, 1e-12, 4)).toBeCloseTo(Math.pow(2e12, 1 / 8), 10);
  });

  // Thresholds 1.5 and 2.5 [published] Sukoriansky et al. 2007; Galperin et al., Ocean Dynamics 60,
  // 427 (2010) [memory for the thresholds].
  it('names the regime from R_β', () => {
    expect(regimeOf(1.2)).toBe('friction-dominated');
    expect(regimeOf(1.5)).toBe('transitional');
    expect(regimeOf(2.49)).toBe('transitional');
    expect(regimeOf(2.5)).toBe('zonostrophic');
    expect(regimeOf(NaN)).toBe('friction-dominated');
  });
});
