import { describe, expect, it } from 'vitest';
import { SteadyCriterion } from '../../lib/analysis/steadyCriterion';

/** Feed E(t) = 1 − e^{−2μt} in steps of dt until the criterion passes; the time it passes at. */
function spinUp(mu: number, dt: number, tol: number): number | null {
  const W = 1 / (2 * mu);
  const c = new SteadyCriterion(0, W, tol);
  for (let t = 0; t < 40 * W; t += dt) if (c.add(t, dt, 1 - Math.exp(-2 * mu * t))) return c.steadyAt;
  return null;
}

describe('steady criterion', () => {
  // Window means of 1 − e^{−s} over s ∈ [n−1, n] differ by (1 − e^{−1})² e^{−(n−2)} between windows
  // n−1 and n [derived in steadyCriterion.ts]: 0.054 at n = 4 fails 5%, 0.0199 at n = 5 passes.
  it('passes at the end of the fifth spin-up window for a 5% tolerance, as derived', () => {
    const mu = 0.05;
    expect(spinUp(mu, 0.01, 0.05)).toBeCloseTo(5 / (2 * mu), 6);
    // 2% needs (1 − e^{−1})² e^{−(n−2)} ≤ 0.02·mean: n = 6 (0.0073 passes, 0.0198 at n = 5 fails).
    expect(spinUp(mu, 0.01, 0.02)).toBeCloseTo(6 / (2 * mu), 6);
  });

  it('never passes before two windows, and passes at once for a constant energy', () => {
    const c = new SteadyCriterion(3, 1, 0.01);
    let at = -1;
    for (let k = 0; k < 400 && at < 0; k++) if (c.add(3 + k * 0.01, 0.01, 2)) at = c.steadyAt!;
    expect(at).toBeCloseTo(5, 9);
    expect(c.lastPair).toEqual([2, 2]);
  });

  it('keeps failing on an energy that grows by a fixed factor per window', () => {
    // Window means in ratio e^{0.2} ≈ 1.22 differ by ≈ 20% of their mean, whatever the level.
    const c = new SteadyCriterion(0, 1, 0.05);
    for (let t = 0; t < 50; t += 0.05) expect(c.add(t, 0.05, Math.exp(t / 5))).toBe(false);
  });
});
