import { describe, expect, it } from 'vitest';
import { fitScaling, percentileInterval } from '../../lib/analysis/scalingFit';
import { RandomStream } from '../../lib/model/randomStream';

/** n points y = A x^b e^{σ g} with x log-spaced over two decades and g standard normal, seeded. */
function synthetic(n: number, A: number, b: number, sigma: number, seed: number) {
  const rng = new RandomStream(seed);
  const g = new Float64Array(2);
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < n; i++) {
    const xi = Math.pow(10, (2 * i) / (n - 1));
    rng.complexGaussian(2, g); // re is N(0, 1)
    x.push(xi);
    y.push(A * Math.pow(xi, b) * Math.exp(sigma * g[0]));
  }
  return { x, y };
}

describe('scaling fit with bootstrap intervals', () => {
  it('recovers an exact power law to round-off, with intervals of zero width', () => {
    const { x, y } = synthetic(12, 2.5, 0.75, 0, 1);
    const f = fitScaling(x, y, { resamples: 200, fixedExponent: 1 });
    expect(f.exponent).toBeCloseTo(0.75, 12);
    expect(f.prefactor).toBeCloseTo(2.5, 11);
    expect(f.exponentCI[0]).toBeCloseTo(0.75, 12);
    expect(f.exponentCI[1]).toBeCloseTo(0.75, 12);
    expect(f.n).toBe(12);
    // With b held at 1 the prefactor is the geometric mean of y/x.
    const gm = Math.exp(x.reduce((s, xi, i) => s + Math.log(y[i] / xi), 0) / x.length);
    expect(f.fixed!.prefactor).toBeCloseTo(gm, 12);
  });

  it('recovers a noisy known law inside its interval, and is reproducible from its seed', () => {
    const { x, y } = synthetic(40, 0.8, 1.5, 0.1, 7);
    const f = fitScaling(x, y, { resamples: 1000, seed: 3 });
    expect(f.exponentCI[0]).toBeLessThan(1.5);
    expect(f.exponentCI[1]).toBeGreaterThan(1.5);
    expect(f.prefactorCI[0]).toBeLessThan(0.8);
    expect(f.prefactorCI[1]).toBeGreaterThan(0.8);
    // OLS slope error σ/√Sxx with ln x spread over ln 100: ≈ 0.1/(4.6·√(40/12)) ≈ 0.012; the 95%
    // interval is about ±2 of those [derived].
    const width = f.exponentCI[1] - f.exponentCI[0];
    expect(width).toBeGreaterThan(0.02);
    expect(width).toBeLessThan(0.08);
    expect(fitScaling(x, y, { resamples: 1000, seed: 3 })).toEqual(f);
    expect(fitScaling(x, y, { resamples: 1000, seed: 4 }).exponentCI).not.toEqual(f.exponentCI);
  });

  it('covers the true exponent about as often as its level says', () => {
    let covered = 0;
    const trials = 200;
    for (let t = 0; t < trials; t++) {
      const { x, y } = synthetic(30, 1, -0.5, 0.2, 100 + t);
      const f = fitScaling(x, y, { resamples: 400, seed: t + 1, level: 0.9 });
      if (f.exponentCI[0] <= -0.5 && -0.5 <= f.exponentCI[1]) covered++;
    }
    // Binomial(200, 0.9) has sd ≈ 4.2; the percentile bootstrap of OLS runs slightly narrow at n = 30.
    expect(covered / trials).toBeGreaterThan(0.8);
    expect(covered / trials).toBeLessThan(0.97);
  });

  it('leaves out unusable points and refuses fits that cannot be made', () => {
    const f = fitScaling([1, 2, NaN, 4, -1, 8], [1, 2, 3, 4, 5, 0], { resamples: 0 });
    expect(f.n).toBe(3);
    expect(f.skipped).toBe(3);
    expect(f.exponent).toBeCloseTo(1, 12);
    expect(f.exponentCI.every(Number.isNaN)).toBe(true);
    expect(() => fitScaling([1, 2], [1, 2])).toThrow(/2 usable points/);
    expect(() => fitScaling([3, 3, 3], [1, 2, 3])).toThrow(/same x/);
    expect(() => fitScaling([1, 2, 3], [1, 2])).toThrow(RangeError);
  });

  it('takes percentiles by linear interpolation between order statistics', () => {
    expect(percentileInterval([4, 1, 3, 2, 5], 0.5)).toEqual([2, 4]);
    const [lo, hi] = percentileInterval([0, 10], 0.8);
    expect(lo).toBeCloseTo(1, 14); // (1 − 0.8)/2 is 0.09999999999999998 in doubles
    expect(hi).toBeCloseTo(9, 14);
    expect(percentileInterval([], 0.9).every(Number.isNaN)).toBe(true);
  });
});
