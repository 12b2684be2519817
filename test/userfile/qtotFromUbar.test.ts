import { describe, expect, it } from 'vitest';
import { StructureDetector } from '../../lib/analysis/jetDetector';
import { boundedIndex } from '../../lib/analysis/staircase';
import { qtotFromUbar } from '../../lib/userfile/qtotFromUbar';
import { staircaseProfile } from '../support/jetFields';
import { noisySeries } from '../support/meanSeries';

/** The staircase of a steady total-PV profile by the one detector (a noise-free window of 16 batch means). */
function staircaseOf(q: number[], y0: number, dy: number, periodic: boolean, beta: number) {
  const d = new StructureDetector({ points: q.length, y0, dy, periodic }, { beta });
  return d.staircase(noisySeries(q, 16));
}

// Perfect staircase [published] Dritschel & McIntyre, J. Atmos. Sci. 65, 855 (2008): total PV
// constant on steps of width L, jumps βL, flow ū = (β/2)(η² − L²/12); the index S = 1 − ρ is 1 for
// it and 0 for βy [derived] (docs/staircase.md).
const beta = 3;

describe('the total PV from ū alone', () => {
  it('is an exact staircase at the midpoints when the jets sit on grid rows [derived]', () => {
    // (ū_{j+1} − ū_j)/dy is ∂yū at the midpoint for a ū quadratic between the rows, so the midpoint
    // values are the step levels exactly unless a cusp lies strictly inside the interval.
    const [ny, Ly, steps] = [256, 8e6, 4];
    const dy = Ly / ny;
    const L = Ly / steps;
    const b = 1.6e-11;
    const u = Float64Array.from({ length: ny }, (_, j) => staircaseProfile(j * dy, L, b, 3 * dy).u);
    const q = qtotFromUbar(u, dy, true, b, 0);
    expect(q.values.length).toBe(ny);
    expect(q.y[0]).toBe(dy / 2);
    const p = staircaseOf(q.values, q.y[0], dy, true, b);
    expect(p.edges.length).toBe(steps);
    p.edges.forEach((e, k) => expect(Math.abs(e - (3 * dy + k * L))).toBeLessThanOrEqual(dy / 2));
    expect(Math.abs((p.meanWidth as number) / L - 1)).toBeLessThan(1e-12);
    expect(Math.abs((p.index as number) - 1)).toBeLessThan(1e-10);
  });

  it('keeps the index near 1 when the jets fall between rows, one midpoint per jet off its step [derived]', () => {
    // Off-grid cusps: the midpoint straddling each cusp is off its level by less than the jump βL, so
    // ρ² < N_jets(βL)²/Σβ²(y − Ȳ)² = 12/(n(1 − 1/n²)) per step of n points; the measured value here is
    // far inside that bound because the straddling value lies between the two levels.
    const [ny, Ly, steps] = [512, 1, 4];
    const dy = Ly / ny;
    const L = Ly / steps;
    const u = Float64Array.from({ length: ny }, (_, j) => staircaseProfile(j * dy, L, beta, 0.43 * dy + 0.1).u);
    const q = qtotFromUbar(u, dy, true, beta, 0);
    const p = staircaseOf(q.values, q.y[0], dy, true, beta);
    expect(p.edges.length).toBe(steps);
    const n = L / dy;
    expect(1 - (p.index as number)).toBeLessThan(Math.sqrt(12 / (n * (1 - 1 / (n * n)))));
    expect(p.index as number).toBeGreaterThan(0.85);
  });

  it('adds −k_d²ψ̄ with ψ̄ = −∫ū dy: a uniform flow U tilts the total PV by k_d²U [derived]', () => {
    const [n, dy, kd, U] = [20, 0.5, 2, 0.3];
    const q = qtotFromUbar(new Float64Array(n).fill(U), dy, false, 1, kd);
    // q = β y + k_d² U y + const: the slope between midpoints is β + k_d²U.
    for (let j = 1; j < q.values.length; j++)
      expect((q.values[j] - q.values[j - 1]) / dy).toBeCloseTo(1 + kd * kd * U, 12);
  });
});

describe('the sharpness index of a bounded profile', () => {
  it('is 0 for the plain gradient βy, whatever the edges [derived]', () => {
    const q = Float64Array.from({ length: 100 }, (_, j) => beta * j * 0.1 + 7);
    expect(Math.abs(boundedIndex(q, beta, 0.1, []).index)).toBeLessThan(1e-13);
    expect(Math.abs(boundedIndex(q, beta, 0.1, [1.05, 4.33, 8]).index)).toBeLessThan(1e-13);
  });
});
