import { describe, expect, it } from 'vitest';
import { ColumnFFT } from '../../lib/model/columnFFT';
import { naiveDFT1 } from '../support/naiveDFT';
import { maxAbs, maxAbsDiff, randomArray } from '../support/random';

// Reference: the DFT definition evaluated directly (a slow reference, common practice).
describe('ColumnFFT', () => {
  for (const n of [1, 2, 4, 8, 16, 32, 64]) {
    for (const cols of [1, 3, 8]) {
      it(`matches the naive DFT for n = ${n}, ${cols} columns, both signs`, () => {
        for (const sign of [-1, 1] as const) {
          const data = randomArray(2 * n * cols, 1000 * n + cols);
          const plan = new ColumnFFT(n, cols);
          const out = data.slice();
          plan.transform(out, sign);
          for (let c = 0; c < cols; c++) {
            const col = new Float64Array(2 * n);
            for (let r = 0; r < n; r++) {
              col[2 * r] = data[2 * (r * cols + c)];
              col[2 * r + 1] = data[2 * (r * cols + c) + 1];
            }
            const ref = naiveDFT1(col, sign);
            const got = new Float64Array(2 * n);
            for (let r = 0; r < n; r++) {
              got[2 * r] = out[2 * (r * cols + c)];
              got[2 * r + 1] = out[2 * (r * cols + c) + 1];
            }
            // Round-off of an FFT grows like log2(n)·ε·|x|; 1e-13 relative is far above it.
            expect(maxAbsDiff(got, ref)).toBeLessThan(1e-13 * Math.max(1, maxAbs(ref)));
          }
        }
      });
    }
  }

  it('backward after forward returns n times the input', () => {
    const n = 128;
    const data = randomArray(2 * n * 5, 7);
    const plan = new ColumnFFT(n, 5);
    const out = data.slice();
    plan.transform(out, -1);
    plan.transform(out, 1);
    for (let i = 0; i < out.length; i++) out[i] /= n;
    expect(maxAbsDiff(out, data)).toBeLessThan(1e-14);
  });

  it('refuses a length that is not a power of two', () => {
    expect(() => new ColumnFFT(12, 1)).toThrow(/power of two/);
  });
});
