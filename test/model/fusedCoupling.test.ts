import { describe, expect, it } from 'vitest';
import { BatchFFT, lastStageInPlace } from '../../lib/model/batchFFT';
import { lastStageAddCoupling, lastStageProductsCoupled } from '../../lib/model/fusedCoupling';
import { lastStageToBlock } from '../../lib/model/fusedStages';
import { Grid } from '../../lib/model/grid';
import { naiveForward2 } from '../support/naiveDFT';
import { randomArray } from '../support/random';

// The two-layer fused stages against BatchFFT's own last stage followed by the plain pass, exact
// (the same operations in the same order: docs/fused-step.md, section 5).
describe('fused stages of the two-layer term', () => {
  it('products of both layers in place, J(ψ₁, ψ₂) = u₁v₂ − u₂v₁ beside them, with the largest speeds', () => {
    const run = 2 * 8 * 16;
    const W1 = randomArray(4 * run, 3);
    const W2 = randomArray(4 * run, 4);
    const r1 = W1.slice();
    const r2 = W2.slice();
    lastStageInPlace(r1, run, 1);
    lastStageInPlace(r2, run, 1);
    const X = new Float64Array(2 * run).fill(9);
    const refX = new Float64Array(2 * run);
    const max = [0, 0, 0, 0];
    for (let i = 0; i < r1.length; i += 2) {
      const [u1, v1, u2, v2] = [r1[i], r1[i + 1], r2[i], r2[i + 1]];
      r1[i] = u1 * v1;
      r1[i + 1] = v1 * v1 - u1 * u1;
      r2[i] = u2 * v2;
      r2[i + 1] = v2 * v2 - u2 * u2;
      refX[i >> 1] = u1 * v2 - u2 * v1;
      [u1, v1, u2, v2].forEach((x, k) => (max[k] = Math.max(max[k], Math.abs(x))));
    }
    const speeds = new Float64Array(4);
    lastStageProductsCoupled(W1, W2, X, run, speeds);
    expect(Array.from(W1)).toEqual(Array.from(r1));
    expect(Array.from(W2)).toEqual(Array.from(r2));
    expect(Array.from(X)).toEqual(Array.from(refX));
    expect(Array.from(speeds)).toEqual(max);
  });

  it('coupling added to both tendencies on the kept modes only, the rest untouched', () => {
    const grid = new Grid({ nx: 32, ny: 64, Lx: 2 * Math.PI, Ly: 5 });
    const { nkx, Kx, ny } = grid;
    const cols = Kx + 1;
    const src = randomArray(2 * ny * cols, 5);
    const out1 = randomArray(2 * grid.spectralSize, 6);
    const out2 = randomArray(2 * grid.spectralSize, 7);
    const ref1 = out1.slice();
    const ref2 = out2.slice();
    lastStageAddCoupling(src, out1, out2, grid, -0.3, 0.7);
    const R = src.slice();
    lastStageInPlace(R, 2 * (ny / 4) * cols, -1);
    for (const jy of grid.keptRows) {
      for (let ix = 0; ix <= Kx; ix++) {
        const t = 2 * (jy * nkx + ix);
        const s = 2 * (jy * cols + ix);
        ref1[t] += -0.3 * R[s];
        ref1[t + 1] += -0.3 * R[s + 1];
        ref2[t] += 0.7 * R[s];
        ref2[t + 1] += 0.7 * R[s + 1];
      }
    }
    expect(Array.from(out1)).toEqual(Array.from(ref1));
    expect(Array.from(out2)).toEqual(Array.from(ref2));
  });

  // The half-size transform of the real coupling grid (twoLayerNonlinear.ts): rows 2y′ and 2y′ + 1
  // packed as one complex column, unpacked by lastStageToBlock into a single-field block, then the y
  // transform: the 2D DFT of X on columns 0..Kx, against the naive DFT of the definition [practice].
  it('transforms the real coupling grid at half size to its 2D spectrum', () => {
    const grid = new Grid({ nx: 16, ny: 32, Lx: 1, Ly: 1 });
    const { nx, ny, nkx, Kx } = grid;
    const X = randomArray(nx * ny, 8); // (x, y) at x·ny + y
    const block = new Float64Array(2 * ny * (Kx + 1));
    lastStageToBlock(new BatchFFT(nx, ny / 2).transformButLast(X.slice(), -1), block, nx, ny / 2, Kx);
    const Y = new BatchFFT(ny, Kx + 1).transform(block, -1);
    const rowMajor = new Float64Array(nx * ny);
    for (let y = 0; y < ny; y++) for (let x = 0; x < nx; x++) rowMajor[y * nx + x] = X[x * ny + y];
    const ref = naiveForward2(rowMajor, nx, ny); // normalised by 1/(nx·ny)
    let worst = 0;
    let scale = 0;
    for (let jy = 0; jy < ny; jy++)
      for (let ix = 0; ix <= Kx; ix++) {
        const a = 2 * (jy * (Kx + 1) + ix);
        const b = 2 * (jy * nkx + ix);
        worst = Math.max(worst, Math.abs(Y[a] / (nx * ny) - ref[b]), Math.abs(Y[a + 1] / (nx * ny) - ref[b + 1]));
        scale = Math.max(scale, Math.abs(ref[b]));
      }
    expect(scale).toBeGreaterThan(0.01);
    expect(worst).toBeLessThan(1e-13 * scale);
  });
});
