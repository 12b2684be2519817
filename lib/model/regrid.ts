import type { Grid } from './grid';

/**
 * Carry a half-plane spectrum from one grid to another of the same domain, mode by mode: modes both
 * grids keep are copied, modes only the new one keeps are zero (padding), the rest are dropped
 * (truncation). Amplitudes need no rescaling under the normalisation of grid.ts. Returns a new array.
 */
export function regridSpectrum(src: Float64Array, from: Grid, to: Grid): Float64Array {
  if (from.Lx !== to.Lx || from.Ly !== to.Ly) throw new RangeError('regridSpectrum: the domain must stay the same');
  const out = new Float64Array(2 * to.spectralSize);
  for (let jy = 0; jy < to.ny; jy++) {
    const m = to.rowIndex(jy);
    if (Math.abs(m) > Math.min(to.Ky, from.Ky)) continue;
    const sjy = m >= 0 ? m : from.ny + m;
    for (let ix = 0; ix <= Math.min(to.Kx, from.Kx); ix++) {
      if (!to.kept(ix, jy) || !from.kept(ix, sjy)) continue;
      const s = 2 * (sjy * from.nkx + ix);
      const d = 2 * (jy * to.nkx + ix);
      out[d] = src[s];
      out[d + 1] = src[s + 1];
    }
  }
  return out;
}
