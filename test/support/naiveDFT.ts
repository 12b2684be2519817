/**
 * Slow reference transforms, straight from the definitions in lib/model/grid.ts, for checking the fast
 * ones. O(N²) per 1D transform, O(N⁴) for 2D: use on small grids only.
 */

/** X[k] = Σ_r x[r] e^{sign·2πi·r·k/n}, complex interleaved, unnormalised. */
export function naiveDFT1(x: Float64Array, sign: -1 | 1): Float64Array {
  const n = x.length / 2;
  const out = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    let sr = 0;
    let si = 0;
    for (let r = 0; r < n; r++) {
      const ang = (sign * 2 * Math.PI * ((r * k) % n)) / n;
      const c = Math.cos(ang);
      const s = Math.sin(ang);
      sr += x[2 * r] * c - x[2 * r + 1] * s;
      si += x[2 * r] * s + x[2 * r + 1] * c;
    }
    out[2 * k] = sr;
    out[2 * k + 1] = si;
  }
  return out;
}

/** Half-plane spectrum of a real nx × ny field: (1/N) Σ f e^{−ik·x}, layout of grid.ts. */
export function naiveForward2(f: Float64Array, nx: number, ny: number): Float64Array {
  const nkx = nx / 2 + 1;
  const out = new Float64Array(2 * ny * nkx);
  for (let jy = 0; jy < ny; jy++) {
    for (let ix = 0; ix < nkx; ix++) {
      let sr = 0;
      let si = 0;
      for (let y = 0; y < ny; y++) {
        for (let x = 0; x < nx; x++) {
          const ang = -2 * Math.PI * (((ix * x) % nx) / nx + ((jy * y) % ny) / ny);
          sr += f[y * nx + x] * Math.cos(ang);
          si += f[y * nx + x] * Math.sin(ang);
        }
      }
      out[2 * (jy * nkx + ix)] = sr / (nx * ny);
      out[2 * (jy * nkx + ix) + 1] = si / (nx * ny);
    }
  }
  return out;
}

/** Real field from a half-plane spectrum: Σ over the full plane, conjugate symmetry filling kx < 0. */
export function naiveInverse2(fHat: Float64Array, nx: number, ny: number): Float64Array {
  const nkx = nx / 2 + 1;
  const out = new Float64Array(nx * ny);
  for (let y = 0; y < ny; y++) {
    for (let x = 0; x < nx; x++) {
      let s = 0;
      for (let jy = 0; jy < ny; jy++) {
        for (let ix = 0; ix < nkx; ix++) {
          const w = ix === 0 || ix === nx / 2 ? 1 : 2;
          const ang = 2 * Math.PI * (((ix * x) % nx) / nx + ((jy * y) % ny) / ny);
          const re = fHat[2 * (jy * nkx + ix)];
          const im = fHat[2 * (jy * nkx + ix) + 1];
          s += w * (re * Math.cos(ang) - im * Math.sin(ang));
        }
      }
      out[y * nx + x] = s;
    }
  }
  return out;
}
