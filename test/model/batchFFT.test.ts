import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { BatchFFT, lastStageInPlace } from '../../lib/model/batchFFT';
import { naiveDFT1 } from '../support/naiveDFT';
import { maxAbs, maxAbsDiff, randomArray } from '../support/random';

function column(block: Float64Array, n: number, cols: number, c: number): Float64Array {
  const out = new Float64Array(2 * n);
  for (let r = 0; r < n; r++) {
    out[2 * r] = block[2 * (r * cols + c)];
    out[2 * r + 1] = block[2 * (r * cols + c) + 1];
  }
  return out;
}

// Reference 1: the DFT definition evaluated directly (a slow reference, common practice).
describe('BatchFFT against the naive DFT', () => {
  for (const n of [1, 2, 4, 8, 16, 32, 64, 128]) {
    for (const cols of [1, 3, 8]) {
      it(`matches for n = ${n}, ${cols} columns, both signs`, () => {
        for (const sign of [-1, 1] as const) {
          const data = randomArray(2 * n * cols, 1000 * n + cols);
          const plan = new BatchFFT(n, cols);
          const out = plan.transform(data.slice(), sign);
          for (let c = 0; c < cols; c++) {
            const ref = naiveDFT1(column(data, n, cols, c), sign);
            // Round-off of an FFT grows like log2(n)·ε·|x|; 1e-13 relative is far above it.
            expect(maxAbsDiff(column(out, n, cols, c), ref)).toBeLessThan(1e-13 * Math.max(1, maxAbs(ref)));
          }
        }
      });
    }
  }
});

// Reference 2: fft.js, a general-purpose FFT library from the npm registry, at the sizes the model uses.
describe('BatchFFT against fft.js', () => {
  for (const n of [256, 512, 1024]) {
    it(`agrees at n = ${n}`, () => {
      const cols = 3;
      const data = randomArray(2 * n * cols, n);
      const out = new BatchFFT(n, cols).transform(data.slice(), -1);
      const lib = new FFT(n);
      for (let c = 0; c < cols; c++) {
        const ref = new Float64Array(2 * n);
        lib.transform(ref, column(data, n, cols, c));
        expect(maxAbsDiff(column(out, n, cols, c), ref)).toBeLessThan(1e-12 * maxAbs(ref));
      }
    });
  }
});

describe('BatchFFT contract', () => {
  it('backward after forward returns n times the input', () => {
    const n = 128;
    const data = randomArray(2 * n * 5, 7);
    const plan = new BatchFFT(n, 5);
    const work = data.slice();
    plan.transformInPlace(work, -1);
    plan.transformInPlace(work, 1);
    for (let i = 0; i < work.length; i++) work[i] /= n;
    expect(maxAbsDiff(work, data)).toBeLessThan(1e-14);
  });

  it('leaves the result in the data or the scratch passed, and returns the one holding it', () => {
    for (const n of [16, 32]) {
      const plan = new BatchFFT(n, 2);
      const a = randomArray(4 * n, n);
      const scratch = new Float64Array(4 * n);
      const ref = plan.transform(a.slice(), -1).slice();
      const out = plan.transform(a, -1, scratch);
      expect(out === a || out === scratch).toBe(true);
      expect(maxAbsDiff(out, ref)).toBe(0);
      expect(() => plan.transform(a, -1, a)).toThrow(/scratch/);
    }
  });

  it('transformButLast then lastStageInPlace is the whole transform, bit for bit', () => {
    for (const n of [4, 8, 64, 128]) {
      const plan = new BatchFFT(n, 3);
      const a = randomArray(6 * n, 3 * n);
      const whole = plan.transform(a.slice(), 1).slice();
      const mid = plan.transformButLast(a, 1);
      lastStageInPlace(mid, plan.lastRun, 1);
      expect(maxAbsDiff(mid, whole)).toBe(0);
    }
  });

  it('refuses a length that is not a power of two', () => {
    expect(() => new BatchFFT(12, 1)).toThrow(/power of two/);
  });
});
