/**
 * Finite-difference derivatives on a regular grid, periodic or bounded, for fields that the spectral
 * route cannot take (a bounded axis, a size that is not a power of two, or missing values). Second
 * order: centred differences inside, wrapped across a periodic axis; one-sided first-order
 * differences on the two edges of a bounded axis. A NaN neighbour gives NaN (missing stays missing).
 * Layout row-major, y slow (j·nx + i); dx, dy the spacings.
 */
export interface FdGrid {
  nx: number;
  ny: number;
  dx: number;
  dy: number;
  periodicX: boolean;
  periodicY: boolean;
}

/** out ← ∂f/∂x (out must not be f). */
export function ddx(g: FdGrid, f: Float64Array, out: Float64Array): Float64Array {
  const { nx, ny, dx, periodicX } = g;
  for (let j = 0; j < ny; j++) {
    const r = j * nx;
    for (let i = 0; i < nx; i++) {
      let a = i + 1;
      let b = i - 1;
      let h = 2 * dx;
      if (a === nx) [a, h] = periodicX ? [0, h] : [i, dx];
      if (b < 0) [b, h] = periodicX ? [nx - 1, h] : [i, dx];
      out[r + i] = nx > 1 ? (f[r + a] - f[r + b]) / h : 0;
    }
  }
  return out;
}

/** out ← ∂f/∂y (out must not be f). */
export function ddy(g: FdGrid, f: Float64Array, out: Float64Array): Float64Array {
  const { nx, ny, dy, periodicY } = g;
  for (let j = 0; j < ny; j++) {
    let a = j + 1;
    let b = j - 1;
    let h = 2 * dy;
    if (a === ny) [a, h] = periodicY ? [0, h] : [j, dy];
    if (b < 0) [b, h] = periodicY ? [ny - 1, h] : [j, dy];
    for (let i = 0; i < nx; i++) out[j * nx + i] = ny > 1 ? (f[a * nx + i] - f[b * nx + i]) / h : 0;
  }
  return out;
}

/** out ← ∇²f with the 5-point stencil; on a bounded edge the second difference of the three nearest points. */
export function laplacian(g: FdGrid, f: Float64Array, out: Float64Array): Float64Array {
  const { nx, ny, dx, dy } = g;
  const second = (n: number, periodic: boolean, k: number): [number, number, number] => {
    if (periodic) return [(k - 1 + n) % n, k, (k + 1) % n];
    if (k === 0) return [0, 1, 2];
    if (k === n - 1) return [n - 3, n - 2, n - 1];
    return [k - 1, k, k + 1];
  };
  for (let j = 0; j < ny; j++) {
    const [js, jc, jn] = second(ny, g.periodicY, j);
    for (let i = 0; i < nx; i++) {
      const [iw, ic, ie] = second(nx, g.periodicX, i);
      const fxx = nx >= 3 ? (f[j * nx + iw] - 2 * f[j * nx + ic] + f[j * nx + ie]) / (dx * dx) : 0;
      const fyy = ny >= 3 ? (f[js * nx + i] - 2 * f[jc * nx + i] + f[jn * nx + i]) / (dy * dy) : 0;
      out[j * nx + i] = fxx + fyy;
    }
  }
  return out;
}

/** Centred derivative of a profile (length n, spacing dy), wrapped when periodic, one-sided at bounded ends. */
export function profileDerivative(
  f: ArrayLike<number>,
  dy: number,
  periodic: boolean,
  out: Float64Array,
): Float64Array {
  const n = f.length;
  for (let j = 0; j < n; j++) {
    if (periodic) out[j] = (f[(j + 1) % n] - f[(j - 1 + n) % n]) / (2 * dy);
    else if (j === 0) out[j] = (f[1] - f[0]) / dy;
    else if (j === n - 1) out[j] = (f[n - 1] - f[n - 2]) / dy;
    else out[j] = (f[j + 1] - f[j - 1]) / (2 * dy);
  }
  return out;
}
