import { describe, expect, it } from 'vitest';
import { ProfileFFT } from '../../lib/analysis/profileFFT';
import { maxAbs, maxAbsDiff, randomArray } from '../support/random';

const ny = 32;
const Ly = 2.5;
const k = (m: number) => (2 * Math.PI * m) / Ly;
const y = Float64Array.from({ length: ny }, (_, j) => (j * Ly) / ny);
const sample = (f: (y: number) => number) => y.map(f);
/** Round-off of a length-32 transform pair on O(1) data: a few ulps per stage, 5 stages each way. */
const roundOff = (scale: number) => 32 * Number.EPSILON * scale;

describe('ProfileFFT', () => {
  it('differentiates a trigonometric polynomial exactly (to round-off)', () => {
    const p = new ProfileFFT(ny, Ly);
    const f = sample((s) => 0.3 + Math.sin(k(1) * s + 0.2) - 2 * Math.cos(k(7) * s) + 0.5 * Math.sin(k(15) * s));
    const df = sample(
      (s) => k(1) * Math.cos(k(1) * s + 0.2) + 2 * k(7) * Math.sin(k(7) * s) + 0.5 * k(15) * Math.cos(k(15) * s),
    );
    const out = new Float64Array(ny);
    p.derivative(f, out);
    expect(maxAbsDiff(out, df)).toBeLessThan(roundOff(maxAbs(df)));
  });

  it('drops the Nyquist coefficient in a derivative', () => {
    const p = new ProfileFFT(ny, Ly);
    const f = y.map((_, j) => (j % 2 === 0 ? 1 : -1)); // pure Nyquist
    const out = p.derivative(f, new Float64Array(ny));
    expect(maxAbs(out)).toBeLessThan(roundOff(1));
  });

  it('works in place and truncates a band', () => {
    const p = new ProfileFFT(ny, Ly);
    const f = sample((s) => Math.cos(k(2) * s) + Math.sin(k(9) * s));
    p.truncate(f, f, 5);
    expect(
      maxAbsDiff(
        f,
        sample((s) => Math.cos(k(2) * s)),
      ),
    ).toBeLessThan(roundOff(2));
  });

  it('smooths by the Gaussian factor exp(−½(kσ)²) per mode', () => {
    const p = new ProfileFFT(ny, Ly);
    const sigma = 0.05;
    const f = sample((s) => Math.cos(k(3) * s) + Math.cos(k(10) * s));
    const g = (m: number) => Math.exp(-0.5 * (k(m) * sigma) ** 2);
    const expected = sample((s) => g(3) * Math.cos(k(3) * s) + g(10) * Math.cos(k(10) * s));
    expect(maxAbsDiff(p.smooth(f, new Float64Array(ny), sigma), expected)).toBeLessThan(roundOff(2));
  });

  it('reports one-sided amplitudes of cosines and the mean', () => {
    const p = new ProfileFFT(ny, Ly);
    const f = sample((s) => 0.7 + 1.5 * Math.cos(k(4) * s + 1) - 0.25 * Math.sin(k(11) * s));
    const a = p.amplitudes(f);
    expect(a.length).toBe(ny / 2 + 1);
    expect(a[0]).toBeCloseTo(0.7, 14);
    expect(a[4]).toBeCloseTo(1.5, 14);
    expect(a[11]).toBeCloseTo(0.25, 14);
    expect(a[5]).toBeLessThan(roundOff(2));
  });

  it('is the inverse of itself for band = ny/2 (round trip on random data)', () => {
    const p = new ProfileFFT(ny, Ly);
    const f = randomArray(ny, 5);
    expect(maxAbsDiff(p.truncate(f, new Float64Array(ny), ny / 2), f)).toBeLessThan(roundOff(1));
  });

  it('evaluates the trigonometric interpolant anywhere: the samples on the grid, the polynomial off it', () => {
    const p = new ProfileFFT(ny, Ly);
    const poly = (s: number) => 0.3 + Math.sin(k(1) * s + 0.2) - 2 * Math.cos(k(7) * s) + 0.5 * Math.sin(k(15) * s);
    const f = sample(poly);
    const at = [0, y[5], 0.123, 1.7, -0.4, Ly + 0.2];
    p.evaluate(f, at).forEach((v, i) => expect(Math.abs(v - poly(at[i]))).toBeLessThan(roundOff(4)));
  });

  it('refuses a profile of the wrong length and a non-power-of-two size', () => {
    expect(() => new ProfileFFT(ny, Ly).derivative(new Float64Array(10), new Float64Array(10))).toThrow(RangeError);
    expect(() => new ProfileFFT(24, Ly)).toThrow(RangeError);
  });
});
