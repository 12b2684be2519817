import { describe, expect, it } from 'vitest';
import { JetFinder } from '../../lib/analysis/jets';
import { seededSigned } from '../support/random';

const ny = 256;
const Ly = 2 * Math.PI;
const dy = Ly / ny;
const y = Float64Array.from({ length: ny }, (_, j) => (j * Ly) / ny);

/**
 * Error bound of the parabolic refinement on a smooth symmetric crest f ≈ f₀ − c₂x² + c₄x⁴: the
 * quartic term moves the three-point parabola's vertex by at most 0.195·(c₄/c₂)·dy³ over all sub-grid
 * offsets [derived: leading order, maximised numerically over the offset]; 0.25 leaves room for the
 * higher orders. Cosine cos(kx): c₄/c₂ = k²/12. Gaussian exp(−x²/2w²): c₄/c₂ = 1/(4w²).
 */
const vertexBound = (c4OverC2: number) => 0.25 * c4OverC2 * dy ** 3;

/** Sum of periodic Gaussian jets (images ±Ly) of half-width w at positions ys, amplitudes amps. */
function gaussianJets(ys: number[], amps: number[], w: number): Float64Array {
  return y.map((s) => {
    let u = 0;
    ys.forEach((y0, i) => {
      for (const img of [-Ly, 0, Ly]) u += amps[i] * Math.exp(-((s - y0 - img) ** 2) / (2 * w * w));
    });
    return u;
  });
}

describe('jet finding', () => {
  it('locates cosine jets to a small fraction of a grid spacing, with exact width and shear contrast', () => {
    const finder = new JetFinder(ny, Ly);
    const k = 3;
    for (const y0 of [0.01, 0.3, 0.777]) {
      const r = finder.find(y.map((s) => Math.cos(k * (s - y0))));
      expect(r.count).toBe(3);
      r.jets.forEach((jet, i) => {
        expect(Math.abs(jet.y - (y0 + (i * Ly) / 3))).toBeLessThan(vertexBound((k * k) / 12));
        expect(Math.abs(jet.speed - 1)).toBeLessThan((k * dy) ** 2);
        // Half level 0 between peak 1 and minima −1: width π/k [derived]; linear interpolation O(dy²).
        expect(Math.abs(jet.width - Math.PI / k)).toBeLessThan(dy * dy);
        // Flank shears ±k: contrast 2k. A first difference is sin(k·dy/2)/(k·dy/2) of the slope at its
        // midpoint, (k·dy)²/24 low, and the nearest midpoint is within dy/2 of the steepest point,
        // another (k·dy)²/8 at most [derived].
        expect(Math.abs(jet.shearJump / (2 * k) - 1)).toBeLessThan((k * dy) ** 2 / 6);
      });
      expect(r.meanSpacing).toBeCloseTo(Ly / 3, 12);
      expect(r.spacingStd!).toBeLessThan(2 * vertexBound((k * k) / 12));
      expect(r.dominantIndex).toBe(3);
      expect(r.dominantWavenumber).toBeCloseTo(3, 12);
    }
  });

  it('ignores noise wiggles: exactly the real jets, within the bound the noise allows', () => {
    const next = seededSigned(3);
    const k = 3;
    for (const a of [0.05, 0.1, 0.2]) {
      const u = y.map((s) => Math.cos(k * (s - 0.4)) + a * next());
      const r = new JetFinder(ny, Ly).find(u);
      expect(r.count).toBe(3);
      // Any grid point that beats the one nearest the true crest lies where cos(kΔ) ≥ 1 − 2a − (k·dy)²/8;
      // the parabola then moves at most dy/2 [derived].
      const bound = Math.acos(1 - 2 * a - (k * dy) ** 2 / 8) / k + dy / 2;
      r.jets.forEach((jet, i) => {
        const d = Math.abs(((((jet.y - 0.4 - (i * Ly) / 3 + Ly / 2) % Ly) + Ly) % Ly) - Ly / 2);
        expect(d).toBeLessThan(bound);
      });
      // Without the criterion the same profile shows dozens of maxima.
      expect(new JetFinder(ny, Ly, { relativeProminence: 0, minSeparation: 0 }).find(u).count).toBeGreaterThan(15);
    }
  });

  it('finds the cusped jets of the ideal staircase at its edges, with width L(1 − 1/√2)', () => {
    // u = (β/2)(η² − L²/12), η the distance from the step centre, periodic in L [published] Dritschel &
    // McIntyre, J. Atmos. Sci. 65, 855 (2008); the half-prominence width L(1 − 1/√2) [derived]
    // (docs/staircase.md). On the grid the cusp is cut: the highest point lies within dy/2 of it, where
    // u is lower by (βL/2)·dy/2, 3·dy/L of u_max; a peak error δu moves each half-level crossing by
    // δu·√2/(βL) (the slope there is βL/2√2), ≤ 2.5·dy/L of the width [derived]. The CHECKS comparison
    // at 1e-2 is in staircase.test.ts, on a finer grid.
    const [beta, steps, e0] = [4, 5, 0.2 + 0.41 * dy];
    const L = Ly / steps;
    const u = y.map((s) => {
      const eta = s - (e0 + (Math.floor((s - e0) / L) + 0.5) * L);
      return (beta / 2) * (eta * eta - (L * L) / 12);
    });
    const r = new JetFinder(ny, Ly).find(u);
    expect(r.count).toBe(steps);
    expect(r.dominantIndex).toBe(steps);
    r.jets.forEach((jet, k) => {
      // A cusp between grid points: the parabola lands between the two, within dy/2 of it.
      expect(Math.abs(jet.y - (e0 + k * L))).toBeLessThanOrEqual(dy / 2);
      expect(Math.abs(jet.speed / ((beta * L * L) / 12) - 1)).toBeLessThan((3 * dy) / L);
      expect(Math.abs(jet.width / (L * (1 - Math.SQRT1_2)) - 1)).toBeLessThan((2.5 * dy) / L);
    });
    expect(r.spacingStd!).toBeLessThan(dy);
  });

  it('finds a single jet: spacing Ly, no spread, full width at half prominence of a Gaussian', () => {
    const w = 0.2;
    const y0 = 2.0 + 0.3 * dy;
    const r = new JetFinder(ny, Ly).find(gaussianJets([y0], [1.5], w).map((u) => u - 0.1));
    expect(r.count).toBe(1);
    const jet = r.jets[0];
    expect(Math.abs(jet.y - y0)).toBeLessThan(vertexBound(1 / (4 * w * w)));
    expect(jet.minSouth).toBe(jet.minNorth);
    // Half-way between the peak and the baseline: FWHM = 2√(2 ln 2)·w [derived]; the baseline carries
    // the far Gaussian tail, exp(−(Ly/2)²/2w²) ≈ 1e-107: negligible.
    expect(Math.abs(jet.width - 2 * Math.sqrt(2 * Math.LN2) * w)).toBeLessThan((0.5 * (dy * dy)) / w);
    expect(jet.ySouth).toBeLessThan(jet.y);
    expect(jet.yNorth).toBeGreaterThan(jet.y);
    expect(r.spacings).toEqual([Ly]);
    expect(r.spacingStd).toBe(0);
  });

  it('handles a jet across the periodic seam (y = 0)', () => {
    const r = new JetFinder(ny, Ly).find(gaussianJets([0.2 * dy], [1], 0.3));
    expect(r.count).toBe(1);
    expect(Math.abs(r.jets[0].y - 0.2 * dy)).toBeLessThan(vertexBound(1 / (4 * 0.3 * 0.3)));
    expect(r.jets[0].ySouth).toBeLessThan(0);
  });

  it('recovers unequal spacings and their spread', () => {
    const ys = [0.5, 1.4, 3.0, 4.6];
    const r = new JetFinder(ny, Ly).find(gaussianJets(ys, [1, 0.8, 1.2, 0.9], 0.15).map((u) => u - 0.2));
    expect(r.count).toBe(4);
    const truth = [0.9, 1.6, 1.6, 0.5 + Ly - 4.6];
    const mean = truth.reduce((a, b) => a + b) / 4;
    const std = Math.sqrt(truth.reduce((a, s) => a + (s - mean) ** 2, 0) / 4);
    const bound = vertexBound(1 / (4 * 0.15 * 0.15));
    r.jets.forEach((jet, i) => expect(Math.abs(jet.y - ys[i])).toBeLessThan(bound));
    r.spacings.forEach((s, i) => expect(Math.abs(s - truth[i])).toBeLessThan(2 * bound));
    expect(r.meanSpacing).toBeCloseTo(Ly / 4, 12);
    expect(Math.abs(r.spacingStd! - std)).toBeLessThan(2 * bound);
  });

  it('finds no jets in a flat profile, exact or with round-off', () => {
    const finder = new JetFinder(ny, Ly);
    const next = seededSigned(9);
    for (const u of [new Float64Array(ny), new Float64Array(ny).fill(3.7), y.map(() => 3.7 * (1 + 4e-16 * next()))]) {
      const r = finder.find(u);
      expect(r.count).toBe(0);
      expect(r.meanSpacing).toBeNull();
      expect(r.spacingStd).toBeNull();
      expect(r.dominantIndex).toBe(0);
    }
  });

  it('counts only eastward maxima: above the domain mean by default, or a given floor', () => {
    // A broad strong jet at y = 1 and a narrow crest at y = 4 whose top (≈ −0.47) lies below the
    // domain mean (≈ +0.2): a prominent maximum, but not an eastward jet.
    const u = gaussianJets([1], [3], 1).map((v, j) => v + gaussianJets([4], [0.5], 0.2)[j] - 1);
    const mean = u.reduce((a, b) => a + b) / ny;
    expect(u[Math.round(4 / dy)]).toBeLessThan(mean - 0.5);
    const r = new JetFinder(ny, Ly, { relativeProminence: 0.1 }).find(u);
    expect(r.count).toBe(1);
    expect(Math.abs(r.jets[0].y - 1)).toBeLessThan(0.05);
    expect(new JetFinder(ny, Ly, { relativeProminence: 0.1, floor: -Infinity }).find(u).count).toBe(2);
  });

  it('picks the dominant meridional wavenumber by amplitude', () => {
    const r = new JetFinder(ny, Ly).find(y.map((s) => 0.3 * Math.cos(2 * s) + Math.cos(5 * s + 1)));
    expect(r.dominantIndex).toBe(5);
    expect(r.dominantAmplitude).toBeCloseTo(1, 12);
  });

  it('gives the core mean of −∂y(u′v′) from the fluxes at the core edges', () => {
    // Cosine jets of k = 3 have cores [y0 − π/2k, y0 + π/2k]; with u′v′ = A sin(k(y − y0)) the
    // convergence −Ak cos(k(y − y0)) averages to −2Ak/π over a core [derived].
    const finder = new JetFinder(ny, Ly);
    const [k, A, y0] = [3, 0.7, 0.5];
    const r = finder.find(y.map((s) => Math.cos(k * (s - y0))));
    const upvp = y.map((s) => A * Math.sin(k * (s - y0)));
    for (const jet of r.jets)
      expect(Math.abs(finder.coreConvergence(jet, upvp) + (2 * A * k) / Math.PI)).toBeLessThan(2 * dy * dy * A * k * k);
  });

  it('refuses a profile of the wrong length', () => {
    expect(() => new JetFinder(ny, Ly).find(new Float64Array(10))).toThrow(RangeError);
  });
});
