import { describe, expect, it } from 'vitest';
import { profileStaircase, boundedIndex } from '../../lib/analysis/profileStaircase';
import { StaircaseFitter } from '../../lib/analysis/staircase';
import { qtotFromUbar } from '../../lib/userfile/qtotFromUbar';
import { staircaseProfile } from '../support/jetFields';

// Perfect staircase [published] Dritschel & McIntyre, J. Atmos. Sci. 65, 855 (2008): total PV
// constant on steps of width L, jumps βL, flow ū = (β/2)(η² − L²/12); the index S = 1 − ρ is 1 for
// it and 0 for βy [derived] (docs/staircase.md).
const beta = 3;

describe('PV staircases of profiles of any length, periodic or bounded', () => {
  it('are those of StaircaseFitter on a periodic profile of 2^k points', () => {
    const [ny, Ly] = [512, 2 * Math.PI];
    const dy = Ly / ny;
    const q = Float64Array.from({ length: ny }, (_, j) => beta * staircaseProfile(j * dy, Ly / 5, beta, 0.41).centre);
    const ref = new StaircaseFitter(ny, Ly, beta).fit(q);
    const p = profileStaircase(q, 0, dy, true, beta);
    expect(p.method).toBe('direct');
    expect(p.edges).toEqual(ref.edges);
    expect(p.index).toBe(ref.index);
    expect(Math.abs(p.index - 1)).toBeLessThan(1e-13);
  });

  it('find steps, widths and index 1 on a bounded profile that does not span whole steps', () => {
    const [ny, dy, L] = [300, 0.01, 0.55];
    const e0 = 0.2037;
    const q = Float64Array.from({ length: ny }, (_, j) => beta * staircaseProfile(j * dy, L, beta, e0).centre);
    const p = profileStaircase(q, 10, dy, false, beta);
    expect(p.method).toBe('extended');
    // Edges e0 + k·L inside the domain [0, 2.99], away from its ends by the 1.5-spacing margin.
    const truth = [0, 1, 2, 3, 4, 5, 6].map((k) => e0 + k * L).filter((e) => e > 1.5 * dy && e < (ny - 1 - 1.5) * dy);
    expect(truth.length).toBe(6);
    expect(p.edges.length).toBe(truth.length);
    p.edges.forEach((e, k) => expect(Math.abs(e - (10 + e0 + k * L))).toBeLessThanOrEqual(dy / 2 + dy / 8));
    for (const w of p.widths) expect(Math.abs(w - L)).toBeLessThan(dy + dy / 4);
    p.jumps.forEach((h) => expect(Math.abs(h / (beta * L) - 1)).toBeLessThan(1e-12));
    // Levels are exact on every step, the two cut at the ends too: S = 1 to round-off.
    expect(Math.abs(p.index - 1)).toBeLessThan(1e-12);
  });

  it('give index 0 for the plain gradient βy on a bounded profile, whatever the edges', () => {
    const q = Float64Array.from({ length: 100 }, (_, j) => beta * j * 0.1 + 7);
    expect(Math.abs(boundedIndex(q, beta, 0.1, []).index)).toBeLessThan(1e-13);
    expect(Math.abs(boundedIndex(q, beta, 0.1, [1.05, 4.33, 8]).index)).toBeLessThan(1e-13);
    expect(profileStaircase(q, 0, 0.1, false, beta).edges).toEqual([]);
  });
});

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
    const p = profileStaircase(q.values, q.y[0], dy, true, b);
    expect(p.edges.length).toBe(steps);
    p.edges.forEach((e, k) => expect(Math.abs(e - (3 * dy + k * L))).toBeLessThanOrEqual(dy / 2));
    expect(Math.abs((p.meanWidth as number) / L - 1)).toBeLessThan(1e-12);
    expect(Math.abs(p.index - 1)).toBeLessThan(1e-10);
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
    const p = profileStaircase(q.values, q.y[0], dy, true, beta);
    expect(p.edges.length).toBe(steps);
    const n = L / dy;
    expect(1 - p.index).toBeLessThan(Math.sqrt(12 / (n * (1 - 1 / (n * n)))));
    expect(p.index).toBeGreaterThan(0.85);
  });

  it('adds −k_d²ψ̄ with ψ̄ = −∫ū dy: a uniform flow U tilts the total PV by k_d²U [derived]', () => {
    const [n, dy, kd, U] = [20, 0.5, 2, 0.3];
    const q = qtotFromUbar(new Float64Array(n).fill(U), dy, false, 1, kd);
    // q = β y + k_d² U y + const: the slope between midpoints is β + k_d²U.
    for (let j = 1; j < q.values.length; j++)
      expect((q.values[j] - q.values[j - 1]) / dy).toBeCloseTo(1 + kd * kd * U, 12);
  });
});
