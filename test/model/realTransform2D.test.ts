import { describe, expect, it } from 'vitest';
import { Grid } from '../../lib/model/grid';
import { RealTransform2D } from '../../lib/model/realTransform2D';
import { naiveForward2, naiveInverse2 } from '../support/naiveDFT';
import { maxAbs, maxAbsDiff, randomArray } from '../support/random';

const sizes: Array<[number, number]> = [
  [4, 4],
  [8, 8],
  [16, 8],
  [8, 32],
  [32, 32],
];

function gridOf(nx: number, ny: number): Grid {
  return new Grid({ nx, ny, Lx: 2 * Math.PI, Ly: 3 });
}

/** Zeroes every stored coefficient the 2/3 rule discards, and the mean. */
function truncate(grid: Grid, fHat: Float64Array): Float64Array {
  const out = fHat.slice();
  for (let jy = 0; jy < grid.ny; jy++) {
    for (let ix = 0; ix < grid.nkx; ix++) {
      if (!grid.kept(ix, jy)) out[2 * (jy * grid.nkx + ix)] = out[2 * (jy * grid.nkx + ix) + 1] = 0;
    }
  }
  return out;
}

// Reference: the transform definitions in lib/model/grid.ts evaluated directly (common practice).
describe('RealTransform2D against the naive 2D DFT', () => {
  for (const [nx, ny] of sizes) {
    it(`full forward and inverse match at ${nx}×${ny}`, () => {
      const grid = gridOf(nx, ny);
      const plan = new RealTransform2D(grid, false);
      const a = randomArray(nx * ny, nx * 31 + ny);
      const b = randomArray(nx * ny, nx * 37 + ny + 1);
      const aHat = new Float64Array(2 * grid.spectralSize);
      const bHat = new Float64Array(2 * grid.spectralSize);
      plan.forwardPair(a, b, aHat, bHat);
      const refA = naiveForward2(a, nx, ny);
      const refB = naiveForward2(b, nx, ny);
      expect(maxAbsDiff(aHat, refA)).toBeLessThan(1e-14);
      expect(maxAbsDiff(bHat, refB)).toBeLessThan(1e-14);
      const a2 = new Float64Array(nx * ny);
      const b2 = new Float64Array(nx * ny);
      plan.inversePair(refA, refB, a2, b2);
      expect(maxAbsDiff(a2, naiveInverse2(refA, nx, ny))).toBeLessThan(1e-13);
      expect(maxAbsDiff(a2, a)).toBeLessThan(1e-13);
      expect(maxAbsDiff(b2, b)).toBeLessThan(1e-13);
    });

    it(`pruned transforms equal the truncated full ones at ${nx}×${ny}`, () => {
      const grid = gridOf(nx, ny);
      const pruned = new RealTransform2D(grid, true);
      const a = randomArray(nx * ny, nx * 41 + ny);
      const aHat = new Float64Array(2 * grid.spectralSize);
      pruned.forward(a, aHat);
      const ref = truncate(grid, naiveForward2(a, nx, ny));
      expect(maxAbsDiff(aHat, ref)).toBeLessThan(1e-14);
      // Inverse of a spectrum with discarded modes present: they must be ignored.
      const noisy = naiveForward2(a, nx, ny);
      const g = new Float64Array(nx * ny);
      pruned.inverse(noisy, g);
      expect(maxAbsDiff(g, naiveInverse2(ref, nx, ny))).toBeLessThan(1e-13);
    });
  }

  it('single-field calls agree with the pair calls and leave their partners clean', () => {
    const grid = gridOf(32, 16);
    const plan = new RealTransform2D(grid, false);
    const a = randomArray(grid.size, 5);
    const hat1 = new Float64Array(2 * grid.spectralSize);
    const hat2 = new Float64Array(2 * grid.spectralSize);
    for (let rep = 0; rep < 3; rep++) {
      plan.forward(a, hat1);
      plan.forwardPair(a, new Float64Array(grid.size), hat2, new Float64Array(2 * grid.spectralSize));
      expect(maxAbsDiff(hat1, hat2)).toBe(0);
      const g = new Float64Array(grid.size);
      plan.inverse(hat1, g);
      expect(maxAbsDiff(g, a)).toBeLessThan(1e-13);
    }
  });
});

// Parseval for the normalisation of grid.ts: mean(f²) = Σ_half w |f̂|² (common practice).
describe('Parseval', () => {
  for (const [nx, ny] of [
    [64, 64],
    [128, 32],
  ] as Array<[number, number]>) {
    it(`holds to round-off at ${nx}×${ny}`, () => {
      const grid = gridOf(nx, ny);
      const plan = new RealTransform2D(grid, false);
      const a = randomArray(grid.size, 99);
      const hat = new Float64Array(2 * grid.spectralSize);
      plan.forward(a, hat);
      let meanSq = 0;
      for (let i = 0; i < a.length; i++) meanSq += a[i] * a[i];
      meanSq /= a.length;
      let spec = 0;
      for (let jy = 0; jy < ny; jy++) {
        for (let ix = 0; ix < grid.nkx; ix++) {
          const q = 2 * (jy * grid.nkx + ix);
          spec += grid.weight(ix) * (hat[q] * hat[q] + hat[q + 1] * hat[q + 1]);
        }
      }
      expect(Math.abs(spec - meanSq) / meanSq).toBeLessThan(1e-13);
      expect(maxAbs(hat)).toBeGreaterThan(0);
    });
  }
});
