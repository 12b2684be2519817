import { describe, expect, it } from 'vitest';
import { ddx, ddy, laplacian, profileDerivative } from '../../lib/userfile/gridDerivatives';

describe('finite differences on periodic and bounded grids', () => {
  const [nx, ny, dx, dy] = [12, 10, 0.5, 0.25];
  const f = (g: (x: number, y: number) => number) =>
    Float64Array.from({ length: nx * ny }, (_, k) => g((k % nx) * dx, Math.floor(k / nx) * dy));

  it('are exact for quadratics inside a bounded grid and for linear functions on its edges', () => {
    const grid = { nx, ny, dx, dy, periodicX: false, periodicY: false };
    const q = f((x, y) => 3 * x * x - 2 * x * y + y * y + 4);
    const fx = ddx(grid, q, new Float64Array(nx * ny));
    const fy = ddy(grid, q, new Float64Array(nx * ny));
    const lap = laplacian(grid, q, new Float64Array(nx * ny));
    for (let j = 1; j < ny - 1; j++) {
      for (let i = 1; i < nx - 1; i++) {
        const [x, y] = [i * dx, j * dy];
        expect(fx[j * nx + i]).toBeCloseTo(6 * x - 2 * y, 10);
        expect(fy[j * nx + i]).toBeCloseTo(-2 * x + 2 * y, 10);
        expect(lap[j * nx + i]).toBeCloseTo(8, 9);
      }
    }
    const lin = f((x, y) => 2 * x - 5 * y);
    const lx = ddx(grid, lin, new Float64Array(nx * ny));
    const ly = ddy(grid, lin, new Float64Array(nx * ny));
    for (let k = 0; k < nx * ny; k++) {
      expect(lx[k]).toBeCloseTo(2, 10);
      expect(ly[k]).toBeCloseTo(-5, 10);
    }
  });

  it('wrap across a periodic axis, with the second-order error of centred differences', () => {
    const grid = { nx, ny, dx, dy, periodicX: true, periodicY: true };
    const [Lx, Ly] = [nx * dx, ny * dy];
    const [kx, ky] = [(2 * Math.PI) / Lx, (2 * Math.PI * 2) / Ly];
    const s = f((x, y) => Math.sin(kx * x) * Math.cos(ky * y));
    const fx = ddx(grid, s, new Float64Array(nx * ny));
    // Centred difference of sin(kx): cos(kx)·sin(k dx)/dx, exactly [derived].
    for (let k = 0; k < nx * ny; k++) {
      const [x, y] = [(k % nx) * dx, Math.floor(k / nx) * dy];
      expect(fx[k]).toBeCloseTo((Math.cos(kx * x) * Math.cos(ky * y) * Math.sin(kx * dx)) / dx, 12);
    }
  });

  it('differentiates profiles, centred and wrapped or one-sided, and propagates NaN', () => {
    const p = Float64Array.from([0, 1, 4, 9, 16]);
    expect(Array.from(profileDerivative(p, 1, false, new Float64Array(5)))).toEqual([1, 2, 4, 6, 7]);
    expect(Array.from(profileDerivative(Float64Array.from([0, 1, 0, -1]), 1, true, new Float64Array(4)))).toEqual([
      1, 0, -1, 0,
    ]);
    const grid = { nx: 3, ny: 1, dx: 1, dy: 1, periodicX: false, periodicY: false };
    expect(Array.from(ddx(grid, Float64Array.from([1, NaN, 3]), new Float64Array(3)))).toEqual([NaN, 1, NaN]);
  });
});
