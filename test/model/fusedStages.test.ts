import { describe, expect, it } from 'vitest';
import { BatchFFT, lastStageInPlace } from '../../lib/model/batchFFT';
import {
  lastStageProducts,
  lastStageToBlock,
  lastStageToTendency,
  lastStageToWorkGrid,
  velocitiesFirstStageY,
} from '../../lib/model/fusedStages';
import { Grid } from '../../lib/model/grid';
import { rowSlabLayout } from '../../lib/model/realTransform2D';
import { randomArray } from '../support/random';

// Reference: the unfused route, BatchFFT's own last stage followed by the pass written out plainly.
// The fused passes promise the same operations in the same order, so equality is bit for bit.
const shapes: Array<[number, number, number]> = [
  [4, 4, 1],
  [8, 16, 2],
  [32, 32, 10],
  [64, 32, 16],
  [32, 32, 16], // unpruned: top = nx/2
];

describe('fused last stages equal the last stage followed by the pass, bit for bit', () => {
  for (const [nx, ny, top] of shapes) {
    it(`block → work grid at ${nx}×${ny}, columns 0..${top}`, () => {
      const cols = 2 * (top + 1);
      const src = randomArray(2 * ny * cols, nx + ny + top);
      const W = randomArray(2 * nx * ny, 1); // stale values must all be overwritten
      const one = rowSlabLayout(nx, ny, 1);
      lastStageToWorkGrid(src, W, one.rowOffset, one.rowStride, one.rowCuts, nx, ny, top);
      const R = src.slice();
      lastStageInPlace(R, 2 * (ny / 4) * cols, 1);
      const ref = new Float64Array(2 * nx * ny);
      for (let kx = 0; kx <= top; kx++) {
        for (let y = 0; y < ny; y++) {
          const ar = R[2 * (y * cols + kx)],
            ai = R[2 * (y * cols + kx) + 1];
          const br = R[2 * (y * cols + top + 1 + kx)],
            bi = R[2 * (y * cols + top + 1 + kx) + 1];
          ref[2 * (kx * ny + y)] = ar - bi;
          ref[2 * (kx * ny + y) + 1] = ai + br;
          if (kx > 0 && kx < nx / 2) {
            ref[2 * ((nx - kx) * ny + y)] = ar + bi;
            ref[2 * ((nx - kx) * ny + y) + 1] = br - ai;
          }
        }
      }
      expect(Array.from(W)).toEqual(Array.from(ref));
      // Cut into row slabs (one per thread), every point lands where the layout says, with the same bits.
      for (const slabs of [2, 3, 5]) {
        const layout = rowSlabLayout(nx, ny, slabs);
        const S = randomArray(2 * nx * ny, slabs);
        lastStageToWorkGrid(src, S, layout.rowOffset, layout.rowStride, layout.rowCuts, nx, ny, top);
        const moved = new Float64Array(2 * nx * ny);
        for (let x = 0; x < nx; x++)
          for (let y = 0; y < ny; y++) {
            const at = layout.rowOffset[y] + x * layout.rowStride[y];
            moved[2 * (x * ny + y)] = S[at];
            moved[2 * (x * ny + y) + 1] = S[at + 1];
          }
        expect(Array.from(moved)).toEqual(Array.from(ref));
      }
    });

    it(`work grid → block at ${nx}×${ny}, columns 0..${top}`, () => {
      const cols = 2 * (top + 1);
      const src = randomArray(2 * nx * ny, 3 * nx + top);
      const block = new Float64Array(2 * ny * cols);
      lastStageToBlock(src, block, nx, ny, top);
      const Y = src.slice();
      lastStageInPlace(Y, 2 * (nx / 4) * ny, -1);
      const ref = new Float64Array(2 * ny * cols);
      for (let k = 0; k <= top; k++) {
        const m = k === 0 ? 0 : nx - k;
        for (let y = 0; y < ny; y++) {
          const yr = Y[2 * (k * ny + y)],
            yi = Y[2 * (k * ny + y) + 1];
          const zr = Y[2 * (m * ny + y)],
            zi = Y[2 * (m * ny + y) + 1];
          const d = 2 * (y * cols + k);
          const db = d + 2 * (top + 1);
          ref[d] = 0.5 * (yr + zr);
          ref[d + 1] = 0.5 * (yi - zi);
          ref[db] = 0.5 * (yi + zi);
          ref[db + 1] = -0.5 * (yr - zr);
        }
      }
      expect(Array.from(block)).toEqual(Array.from(ref));
      // From row slabs (one per thread), each x-major over its own rows: the same block, bit for bit.
      for (const slabs of [2, 3]) {
        const { bounds } = rowSlabLayout(nx, ny, slabs);
        const cut = new Float64Array(2 * ny * cols);
        for (let j = 0; j < slabs; j++) {
          const y0 = bounds[j];
          const rows = bounds[j + 1] - y0;
          const part = new Float64Array(2 * nx * rows);
          for (let x = 0; x < nx; x++)
            for (let y = 0; y < rows; y++) {
              part[2 * (x * rows + y)] = src[2 * (x * ny + y0 + y)];
              part[2 * (x * rows + y) + 1] = src[2 * (x * ny + y0 + y) + 1];
            }
          lastStageToBlock(part, cut, nx, ny, top, y0, y0 + rows, rows, y0);
        }
        expect(Array.from(cut)).toEqual(Array.from(ref));
      }
    });
  }

  it('products (uv, v² − u²) in place, with the largest speeds', () => {
    const run = 2 * 8 * 16;
    const data = randomArray(4 * run, 9);
    const ref = data.slice();
    lastStageInPlace(ref, run, 1);
    let mu = 0;
    let mv = 0;
    for (let i = 0; i < ref.length; i += 2) {
      const u = ref[i];
      const v = ref[i + 1];
      ref[i] = u * v;
      ref[i + 1] = v * v - u * u;
      mu = Math.max(mu, Math.abs(u));
      mv = Math.max(mv, Math.abs(v));
    }
    const speeds = new Float64Array(2);
    lastStageProducts(data, run, speeds);
    expect(Array.from(data)).toEqual(Array.from(ref));
    expect(Array.from(speeds)).toEqual([mu, mv]);
  });

  it('tendency on the kept modes only, the rest of the output untouched', () => {
    const grid = new Grid({ nx: 32, ny: 64, Lx: 2 * Math.PI, Ly: 5 });
    const { nkx, Kx, ny, kx, ky } = grid;
    const cols = 2 * (Kx + 1);
    const src = randomArray(2 * ny * cols, 5);
    const out = new Float64Array(2 * grid.spectralSize).fill(7);
    const scale = 1 / grid.size;
    lastStageToTendency(src, out, grid, scale);
    const R = src.slice();
    lastStageInPlace(R, 2 * (ny / 4) * cols, -1);
    const ref = new Float64Array(2 * grid.spectralSize).fill(7);
    for (const jy of grid.keptRows) {
      for (let ix = 0; ix <= Kx; ix++) {
        const a = (kx[ix] * kx[ix] - ky[jy] * ky[jy]) * scale;
        const b = kx[ix] * ky[jy] * scale;
        const t = 2 * (jy * nkx + ix);
        const s = 2 * (jy * cols + ix);
        ref[t] = a * R[s] + b * R[s + cols];
        ref[t + 1] = a * R[s + 1] + b * R[s + cols + 1];
      }
    }
    expect(Array.from(out)).toEqual(Array.from(ref));
  });

  for (const [nx, ny] of [
    [32, 32],
    [16, 64],
    [32, 128],
    [8, 8],
  ]) {
    it(`velocities into the first backward y stage at ${nx}×${ny}: the block as packed, then the whole y transform`, () => {
      const grid = new Grid({ nx, ny, Lx: 2 * Math.PI, Ly: 3 });
      const { nkx, Kx, kx, ky } = grid;
      const cols = 2 * (Kx + 1);
      const qHat = randomArray(2 * grid.spectralSize, nx + 3 * ny); // every entry, kept or not
      const invK2 = randomArray(grid.spectralSize, 11);
      // Unfused: û = −i ky ψ̂, v̂ = i kx ψ̂ with ψ̂ = −q̂/K² packed on the kept rows, zero elsewhere and at the mean.
      const block = new Float64Array(2 * ny * cols);
      for (const jy of grid.keptRows) {
        for (let ix = 0; ix <= Kx; ix++) {
          if (jy === 0 && ix === 0) continue;
          const m = jy * nkx + ix;
          const pr = -qHat[2 * m] * invK2[m];
          const pi = -qHat[2 * m + 1] * invK2[m];
          const d = 2 * (jy * cols + ix);
          block[d] = ky[jy] * pi;
          block[d + 1] = -ky[jy] * pr;
          block[d + cols] = -kx[ix] * pi;
          block[d + cols + 1] = kx[ix] * pr;
        }
      }
      const fft = new BatchFFT(ny, cols);
      const ref = fft.transform(block, 1).slice();
      const fused = new Float64Array(2 * ny * cols).fill(5); // stale values must all be overwritten
      velocitiesFirstStageY(qHat, invK2, grid, fft.firstRadix, fft.cosT, fft.sinT, fused);
      const out = fft.transformButFirstAndLast(fused, 1, new Float64Array(2 * ny * cols));
      lastStageInPlace(out, fft.lastRun, 1);
      expect(Array.from(out)).toEqual(Array.from(ref));
    });
  }
});
