import type { Grid } from './grid';
import type { LinearOperator } from './linearOperator';

/** The fields a state can be viewed as. */
export type FieldName = 'q' | 'zeta' | 'psi' | 'u' | 'v';
export const FIELD_NAMES: readonly FieldName[] = ['q', 'zeta', 'psi', 'u', 'v'];

/**
 * Spectrum of a derived field from the PV anomaly q̂, into out (half-plane layout):
 *   ψ̂ = −q̂/K²,  ζ̂ = −k²ψ̂,  û = −i ky ψ̂,  v̂ = i kx ψ̂,  K² = k² + k_d².
 * Modes the model does not keep come out zero. out may not alias qHat except for 'q'.
 */
export function fieldSpectrum(
  name: FieldName,
  qHat: Float64Array,
  grid: Grid,
  lin: LinearOperator,
  out: Float64Array,
): void {
  if (name === 'q') {
    if (out !== qHat) out.set(qHat);
    return;
  }
  const { nkx, kx, ky, k2 } = grid;
  const invK2 = lin.invK2;
  for (let jy = 0; jy < grid.ny; jy++) {
    const kyv = ky[jy];
    for (let ix = 0; ix < nkx; ix++) {
      const m = jy * nkx + ix;
      const pr = -qHat[2 * m] * invK2[m];
      const pi = -qHat[2 * m + 1] * invK2[m];
      let re: number;
      let im: number;
      switch (name) {
        case 'psi':
          re = pr;
          im = pi;
          break;
        case 'zeta':
          re = -k2[m] * pr;
          im = -k2[m] * pi;
          break;
        case 'u':
          re = kyv * pi;
          im = -kyv * pr;
          break;
        default: // 'v'
          re = -kx[ix] * pi;
          im = kx[ix] * pr;
      }
      out[2 * m] = re;
      out[2 * m + 1] = im;
    }
  }
}
