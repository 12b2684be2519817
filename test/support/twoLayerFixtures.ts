import type { Grid } from '../../lib/model/grid';
import { seededSigned } from './random';

/**
 * A random two-layer state (q̂₁ then q̂₂) on the kept modes of `grid`, amplitude ∝ scale/(1 + k²), each
 * layer its own draws, the kx = 0 column Hermitian (a real field), seeded; rows with |ky index| > maxM
 * left at zero (band-limited fields whose products the grid does not alias in y when maxM < ny/4).
 */
export function randomTwoLayerState(grid: Grid, seed: number, scale = 1, maxM = Infinity): Float64Array {
  const next = seededSigned(seed);
  const n = 2 * grid.spectralSize;
  const q = new Float64Array(2 * n);
  for (const o of [0, n]) {
    for (let jy = 0; jy < grid.ny; jy++) {
      for (let ix = 0; ix < grid.nkx; ix++) {
        if (!grid.kept(ix, jy) || Math.abs(grid.rowIndex(jy)) > maxM) continue;
        const m = jy * grid.nkx + ix;
        const amp = scale / (1 + grid.k2[m]);
        q[o + 2 * m] = amp * next();
        q[o + 2 * m + 1] = amp * next();
      }
    }
    for (let jy = 1; jy < grid.ny / 2; jy++) {
      const a = o + 2 * jy * grid.nkx;
      const b = o + 2 * (grid.ny - jy) * grid.nkx;
      q[b] = q[a];
      q[b + 1] = -q[a + 1];
    }
  }
  return q;
}
