import { Grid } from '../../lib/model/grid';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';
import { RealTransform2D } from '../../lib/model/realTransform2D';
import { seededSigned } from './random';

/** Unforced, undamped, no-β parameters for tests, on top of which each test sets what it needs. */
export const QUIET: Partial<ModelParams> = {
  beta: 0,
  kd: 0,
  mu: 0,
  nu: 0,
  mu_ls: 0,
  forcing: 'none',
  cfl: 0,
  init_energy: 0,
};

/** Sample a function of (x, y) on the grid of the given parameters. */
export function sampleGrid(
  p: Pick<ModelParams, 'nx' | 'ny' | 'Lx' | 'Ly'>,
  f: (x: number, y: number) => number,
): Float64Array {
  const out = new Float64Array(p.nx * p.ny);
  for (let j = 0; j < p.ny; j++)
    for (let i = 0; i < p.nx; i++) out[j * p.nx + i] = f((i * p.Lx) / p.nx, (j * p.Ly) / p.ny);
  return out;
}

/** Exact (unpruned) half-plane spectrum of a grid field. */
export function spectrumOf(p: Pick<ModelParams, 'nx' | 'ny' | 'Lx' | 'Ly'>, field: Float64Array): Float64Array {
  const grid = new Grid(p);
  const out = new Float64Array(2 * grid.spectralSize);
  new RealTransform2D(grid, false).forward(field, out);
  return out;
}

/** A random state on the kept modes with a red spectrum, amplitude ∝ 1/(1 + k²), seeded. */
export function randomKeptState(model: Model, seed: number, scale = 1): Float64Array {
  const g = model.grid;
  const next = seededSigned(seed);
  const q = new Float64Array(2 * g.spectralSize);
  for (let jy = 0; jy < g.ny; jy++) {
    for (let ix = 0; ix < g.nkx; ix++) {
      if (!g.kept(ix, jy)) continue;
      const m = jy * g.nkx + ix;
      const amp = scale / (1 + g.k2[m]);
      q[2 * m] = amp * next();
      q[2 * m + 1] = amp * next();
    }
  }
  // The kx = 0 column must be Hermitian in ky for a real field.
  for (let jy = 1; jy < g.ny / 2; jy++) {
    const mirror = (g.ny - jy) * g.nkx;
    q[2 * mirror] = q[2 * jy * g.nkx];
    q[2 * mirror + 1] = -q[2 * jy * g.nkx + 1];
  }
  return q;
}

/** Energy ½Σ|q̂|²/K² and enstrophy ½Σ|q̂|² over the full plane, from a half-plane spectrum. */
export function energyEnstrophy(model: Model, qHat: Float64Array = model.qHat): { energy: number; enstrophy: number } {
  const g = model.grid;
  const inv = model.linear.invK2;
  let e = 0;
  let z = 0;
  for (let jy = 0; jy < g.ny; jy++) {
    for (let ix = 0; ix < g.nkx; ix++) {
      const m = jy * g.nkx + ix;
      const s = 0.5 * g.weight(ix) * (qHat[2 * m] ** 2 + qHat[2 * m + 1] ** 2);
      z += s;
      e += s * inv[m];
    }
  }
  return { energy: e, enstrophy: z };
}
