import { describe, expect, it } from 'vitest';
import { JetFinder } from '../../lib/analysis/jets';
import { staircaseSpacing } from '../../lib/analysis/scales';
import { StaircaseFitter, staircaseIndex } from '../../lib/analysis/staircase';
import { seededSigned } from '../support/random';

const Ly = 2 * Math.PI;

/**
 * The perfect staircase of `steps` steps of width L = Ly/steps, edges at e0 + kL (off the grid):
 * total PV constant on each step at the mean of βy over it (PV mixed within the step), and the flow
 * of the parabolic arcs u = (β/2)(η² − L²/12), η the distance from the step centre.
 */
function idealStaircase(ny: number, steps: number, beta: number, e0: number) {
  const L = Ly / steps;
  const qtot = new Float64Array(ny);
  const u = new Float64Array(ny);
  for (let j = 0; j < ny; j++) {
    const y = (j * Ly) / ny;
    const k = Math.floor((y - e0) / L); // step number (−1 below the first edge)
    const centre = e0 + (k + 0.5) * L;
    qtot[j] = beta * centre;
    const eta = y - centre;
    u[j] = (beta / 2) * (eta * eta - (L * L) / 12);
  }
  return { L, qtot, u };
}

describe('PV staircase fit', () => {
  // Perfect staircase [published] Dritschel & McIntyre, J. Atmos. Sci. 65, 855 (2008): steps of width L,
  // jumps βL, zero-mean flow u = (β/2)(y² − L²/12) in |y| < L/2, periodic in L; u_max = βL²/12 (cusp),
  // u_min = −βL²/24, Δu = βL²/8, shear jump βL, u_rms² = β²L⁴/720, L = 720^{1/4}(U_rms/β)^½; the √6
  // limit L/(2u_max/β)^½ [published] Dunkerton & Scott, J. Atmos. Sci. 65, 1105 (2008); [derived] the
  // factors (docs/scales.md). On a grid the cusp is smoothed: gridded fields compared at 1e-2 (CHECKS).
  it('recovers L, the jumps βL, Δu, u_max, u_min, the shear jump and index 1 from the ideal staircase', () => {
    const [ny, steps, beta] = [1024, 4, 3];
    const dy = Ly / ny;
    const e0 = 0.3 + 0.37 * dy;
    const { L, qtot, u } = idealStaircase(ny, steps, beta, e0);
    const fit = new StaircaseFitter(ny, Ly, beta).fit(qtot);
    expect(fit.edges.length).toBe(steps);
    // The samples place a jump anywhere between two grid points: the fit takes the midpoint.
    fit.edges.forEach((e, k) => expect(Math.abs(e - (e0 + k * L))).toBeLessThanOrEqual(dy / 2 + 1e-12));
    fit.widths.forEach((w) => expect(Math.abs(w - L)).toBeLessThanOrEqual(dy + 1e-12));
    expect(fit.meanWidth).toBeCloseTo(L, 12);
    // Levels are exact on the grid, so the jumps are βL to round-off, and so is the index 1.
    fit.jumps.forEach((h) => expect(Math.abs(h / (beta * L) - 1)).toBeLessThan(1e-13));
    fit.idealJumps.forEach((h) => expect(Math.abs(h / (beta * L) - 1)).toBeLessThan(dy / L));
    expect(Math.abs(fit.index - 1)).toBeLessThan(1e-13);

    const jets = new JetFinder(ny, Ly).find(u);
    expect(jets.count).toBe(steps);
    expect(Math.abs(jets.meanSpacing! - L)).toBeLessThan(1e-12);
    const rel = 1e-2; // CHECKS: gridded fields at ~1e-2
    for (const jet of jets.jets) {
      expect(Math.abs(jet.speed / ((beta * L * L) / 12) - 1)).toBeLessThan(rel);
      expect(Math.abs(jet.minSouth / ((-beta * L * L) / 24) - 1)).toBeLessThan(rel);
      expect(Math.abs((jet.speed - jet.minNorth) / ((beta * L * L) / 8) - 1)).toBeLessThan(rel);
      expect(Math.abs(jet.shearJump / (beta * L) - 1)).toBeLessThan(rel);
      // Exactly: the steepest first differences are those of the last whole intervals before the cusp,
      // whose midpoints lie (f + ½)dy and (3/2 − f)dy from it, so the contrast is β(L − 2dy) [derived].
      expect(Math.abs(jet.shearJump / (beta * (L - 2 * dy)) - 1)).toBeLessThan(1e-12);
      // Width at half prominence of the arcs: L(1 − 1/√2) [derived: (β/2)(y² − L²/12) = βL²/48 at y = L/(2√2)].
      expect(Math.abs(jet.width / (L * (1 - Math.SQRT1_2)) - 1)).toBeLessThan(rel);
    }
    const urms = Math.sqrt(u.reduce((a, v) => a + v * v, 0) / ny);
    expect(Math.abs(urms / ((beta * L * L) / Math.sqrt(720)) - 1)).toBeLessThan(rel);
    expect(Math.abs(staircaseSpacing(beta, urms) / L - 1)).toBeLessThan(rel);
    const umax = jets.jets[0].speed;
    expect(Math.abs(L / Math.sqrt((2 * umax) / beta) / Math.sqrt(6) - 1)).toBeLessThan(rel);
  });

  it('gives index 0 for the plain βy gradient, with no edges, and for any partition into steps', () => {
    const [ny, beta] = [256, 2];
    const qtot = Float64Array.from({ length: ny }, (_, j) => beta * ((j * Ly) / ny) - 5);
    const fit = new StaircaseFitter(ny, Ly, beta).fit(qtot);
    expect(fit.edges).toEqual([]);
    expect(fit.widths).toEqual([Ly]);
    expect(Math.abs(fit.index)).toBeLessThan(1e-13);
    for (const edges of [[1], [0.5, 2.2, 5], [0.1, 0.2, 3.3, 3.31, 6]])
      expect(Math.abs(staircaseIndex(qtot, beta, Ly, edges).index)).toBeLessThan(1e-13);
  });

  it('measures the fraction of the rise at the edges: S = α for α·staircase + (1 − α)·βy', () => {
    const [ny, beta] = [256, 4];
    const { qtot: stairs } = idealStaircase(ny, 5, beta, 0.41);
    for (const alpha of [0.2, 0.5, 0.8]) {
      const q = stairs.map((s, j) => alpha * s + (1 - alpha) * beta * ((j * Ly) / ny));
      const fit = new StaircaseFitter(ny, Ly, beta).fit(q);
      expect(fit.edges.length).toBe(5);
      // Within a step q − Q_s = (1 − α)(βy − Ȳ_s β) exactly, so ρ = 1 − α [derived] (docs/staircase.md).
      expect(Math.abs(fit.index - alpha)).toBeLessThan(1e-12);
    }
  });

  it('stays within the stated noise bound: ρ² = ρ₀² + σ²(N − n)/R', () => {
    const [ny, steps, beta] = [512, 4, 1.5];
    const { L, qtot } = idealStaircase(ny, steps, beta, 0.2);
    const next = seededSigned(17);
    for (const a of [0.005, 0.02, 0.05].map((f) => f * beta * L)) {
      const q = qtot.map((v) => v + a * next()); // uniform noise, σ² = a²/3
      const fit = new StaircaseFitter(ny, Ly, beta).fit(q);
      expect(fit.edges.length).toBe(steps);
      // R = β²Σ(y − Ȳ_s)² over the fitted steps; the noise keeps N − n degrees of freedom [derived].
      const ref =
        1 -
        staircaseIndex(
          Float64Array.from({ length: ny }, (_, j) => (beta * j * Ly) / ny),
          beta,
          Ly,
          fit.edges,
        ).rho;
      expect(Math.abs(ref)).toBeLessThan(1e-13);
      const R = fit.widths.reduce((acc, w) => acc + (beta * beta * w * w * (w / (Ly / ny))) / 12, 0);
      const rhoPred = Math.sqrt((((a * a) / 3) * (ny - steps)) / R);
      // Sampling spread of a mean of N squared uniform deviates: relative std 0.894/√N in ρ², half in ρ.
      expect(Math.abs(fit.rho / rhoPred - 1)).toBeLessThan((4 * 0.45) / Math.sqrt(ny - steps) + (2 * (Ly / ny)) / L);
      // The bias is ≈ 2√3·σ/(βL) and does not depend on the grid: here 1 − S < 0.2 for a ≤ 0.05βL.
      expect(1 - fit.index).toBeLessThan(0.2);
    }
  });

  it('keeps a noisy βy near 0 and finds no edges in it', () => {
    const [ny, beta] = [512, 3];
    const dy = Ly / ny;
    const next = seededSigned(23);
    // White noise of σ = 0.2·β·dy, below the level σ ≈ β·dy/4 at which it starts to fake edges (docs).
    const sigma = 0.2 * beta * dy;
    const q = Float64Array.from({ length: ny }, (_, j) => beta * j * dy + sigma * Math.sqrt(3) * next());
    const fit = new StaircaseFitter(ny, Ly, beta).fit(q);
    expect(fit.edges).toEqual([]);
    // One step of width Ly, R = β²Σ(y − ȳ)² ≈ β²N·Ly²/12: ρ² = 1 + 2Σβ(y − ȳ)n/R + Σn′²/R, so
    // S ≈ −Σβ(y − ȳ)n/R − σ²N/(2R), the first term of standard deviation σ/√R [derived]: within 3σ/√R.
    const R = (beta * beta * ny * Ly * Ly) / 12;
    expect(Math.abs(fit.index)).toBeLessThan((3 * sigma) / Math.sqrt(R) + (sigma * sigma * ny) / (2 * R));
  });

  it('keeps βy with strong grid noise near 0 even when the noise fakes edges', () => {
    const [ny, beta] = [512, 3];
    const dy = Ly / ny;
    const next = seededSigned(29);
    const sigma = 3 * beta * dy; // white noise far above the no-spurious-edge level σ ≈ β·dy/4
    const q = Float64Array.from({ length: ny }, (_, j) => beta * j * dy + sigma * Math.sqrt(3) * next());
    const fit = new StaircaseFitter(ny, Ly, beta).fit(q);
    expect(fit.edges.length).toBeGreaterThan(0);
    // The index is formed from q, not from its gradient: with any steps, S ≈ −c − σ²(N − n)/(2R),
    // c of standard deviation σ/√R, R = β²Σ(y − Ȳ_s)² over the steps found [derived]; 3 standard
    // deviations for c and half again for the sampling spread of the noise variance.
    const R = fit.widths.reduce((acc, w) => acc + (beta * beta * w * w * (w / dy)) / 12, 0);
    expect(Math.abs(fit.index)).toBeLessThan(
      (3 * sigma) / Math.sqrt(R) + ((sigma * sigma * (ny - fit.edges.length)) / (2 * R)) * 1.5,
    );
  });

  it('is robust to resolution: a smooth staircase gives the same index on 128 to 1024 points', () => {
    // Steps of width L with tanh edges of width δ: PV βL·Σ ½(1 + tanh((y − e_k)/δ)) − ….
    const beta = 2;
    const L = Ly / 3;
    const delta = 0.08;
    const index = (ny: number) => {
      const q = Float64Array.from({ length: ny }, (_, j) => {
        const y = (j * Ly) / ny;
        let s = 0;
        for (let k = -1; k <= 3; k++) s += 0.5 * (1 + Math.tanh((y - (0.5 + k * L)) / delta));
        return beta * L * s - beta * L; // continuous, rises by βLy per period
      });
      return new StaircaseFitter(ny, Ly, beta).fit(q).index;
    };
    const s = [64, 128, 256, 512, 1024].map(index);
    expect(s[4]).toBeGreaterThan(0.5); // well inside (0, 1): smooth edges leave PV variation in the steps
    expect(s[4]).toBeLessThan(0.9);
    for (const v of s) expect(Math.abs(v - s[4])).toBeLessThan(5e-3);
  });

  it('refuses β ≤ 0 and profiles of the wrong length', () => {
    expect(() => new StaircaseFitter(64, Ly, 0)).toThrow(RangeError);
    expect(() => new StaircaseFitter(64, Ly, 1).fit(new Float64Array(32))).toThrow(RangeError);
  });
});
