import { describe, expect, it } from 'vitest';
import { JetFinder } from '../../lib/analysis/jets';
import { profileJets } from '../../lib/analysis/profileJets';
import { staircaseProfile } from '../support/jetFields';

// Ideal staircase flow [published] Dritschel & McIntyre, J. Atmos. Sci. 65, 855 (2008): jets (cusps)
// at the step edges, spacing L; u_max = βL²/12 [derived] (docs/staircase.md).
const beta = 2;

describe('jets of profiles of any length, periodic or bounded', () => {
  it('are those of JetFinder on a periodic profile of 2^k points (the same numbers as a Stria run)', () => {
    const [ny, Ly] = [256, 2 * Math.PI];
    const u = Float64Array.from({ length: ny }, (_, j) => staircaseProfile((j * Ly) / ny, Ly / 4, beta, 0.3).u);
    const ref = new JetFinder(ny, Ly).find(u);
    const p = profileJets(u, 5, Ly / ny, true);
    expect(p.method).toBe('direct');
    expect(p.count).toBe(ref.count);
    expect(p.jets.map((j) => j.y)).toEqual(ref.jets.map((j) => j.y + 5));
    expect(p.spacings).toEqual(ref.spacings);
  });

  it('find the jets of a periodic profile of 96 points (resampled), within the grid spacing', () => {
    const [ny, Ly, n] = [96, 3, 3];
    const dy = Ly / ny;
    const L = Ly / n;
    const e0 = 0.37 * dy + 0.2;
    const u = Float64Array.from({ length: ny }, (_, j) => staircaseProfile(j * dy, L, beta, e0).u);
    const p = profileJets(u, 0, dy, true);
    expect(p.method).toBe('extended');
    expect(p.count).toBe(n);
    p.jets.forEach((j, k) => expect(Math.abs(j.y - (e0 + k * L))).toBeLessThan(dy));
    expect(Math.abs((p.meanSpacing as number) - L)).toBeLessThan(1e-12);
    for (const j of p.jets) expect(Math.abs(j.speed / ((beta * L * L) / 12) - 1)).toBeLessThan(0.05); // the cusp is cut by the sampling
  });

  it('on a bounded domain count only interior jets and measure spacings without wrapping', () => {
    // Five steps' worth of flow on a domain that does not span whole periods, edges off the grid.
    const [ny, dy, L] = [181, 0.01, 0.37];
    const e0 = 0.113;
    const u = Float64Array.from({ length: ny }, (_, j) => staircaseProfile(j * dy, L, beta, e0).u);
    const p = profileJets(u, -0.9, dy, false);
    const truth = [0, 1, 2, 3, 4].map((k) => e0 + k * L).filter((y) => y > 1.5 * dy && y < (ny - 1 - 1.5) * dy);
    expect(p.count).toBe(truth.length);
    p.jets.forEach((j, k) => expect(Math.abs(j.y - (-0.9 + truth[k]))).toBeLessThan(dy));
    expect(p.spacings.length).toBe(truth.length - 1);
    for (const s of p.spacings) expect(Math.abs(s - L)).toBeLessThan(dy);
  });

  it('does not call a maximum at the edge of a bounded domain a jet', () => {
    const u = Float64Array.from({ length: 50 }, (_, j) => Math.cos((Math.PI * j) / 49)); // highest at the south wall
    expect(profileJets(u, 0, 1, false).count).toBe(0);
  });
});
