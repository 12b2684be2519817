import type { FieldName } from './fields';
import type { Grid } from './grid';
import type { TwoLayerLinearOperator } from './twoLayerLinear';

/**
 * The ways a two-layer state can be viewed: a layer, the barotropic (depth-weighted mean) flow
 * f_bt = h₁f₁ + h₂f₂, or the baroclinic (interface) flow f₁ − f₂, h_i = H_i/H.
 */
export type LayerView = 'upper' | 'lower' | 'barotropic' | 'baroclinic';
export const LAYER_VIEWS: readonly LayerView[] = ['upper', 'lower', 'barotropic', 'baroclinic'];

/**
 * Spectrum of a field of a two-layer state in a view, into out (half-plane layout of grid.ts).
 * qHat holds q̂₁ then q̂₂. Every field is linear in q̂, so the view of a field is the field of the view:
 *   upper q₁, ψ₁ = ψ_bt + h₂τ;  lower q₂, ψ₂ = ψ_bt − h₁τ;  barotropic h₁q₁ + h₂q₂, ψ_bt;
 *   baroclinic q₁ − q₂, τ = ψ₁ − ψ₂;
 * with ψ̂_bt = −(h₁q̂₁ + h₂q̂₂)/k², τ̂ = −(q̂₁ − q̂₂)/(k² + k_d²) (twoLayerLinear.ts); then ζ̂ = −k²ψ̂,
 * û = −i ky ψ̂, v̂ = i kx ψ̂ as in fields.ts. Modes the model does not keep come out zero. The barotropic
 * view's q is its relative vorticity (h₁q₁ + h₂q₂ = ∇²ψ_bt). out may not alias qHat.
 */
export function layerFieldSpectrum(
  name: FieldName,
  view: LayerView,
  qHat: Float64Array,
  grid: Grid,
  lin: TwoLayerLinearOperator,
  out: Float64Array,
): void {
  const { nkx, kx, ky, k2 } = grid;
  const n = 2 * grid.spectralSize;
  const { h1, h2 } = lin.coefficients;
  const ib = lin.invK2Barotropic;
  const ic = lin.invK2Baroclinic;
  const kept = lin.kept;
  // Weights of q₁, q₂ in the view's q and of ψ_bt, τ in its ψ.
  const [w1, w2, wb, wt] =
    view === 'upper'
      ? [1, 0, 1, h2]
      : view === 'lower'
        ? [0, 1, 1, -h1]
        : view === 'barotropic'
          ? [h1, h2, 1, 0]
          : [1, -1, 0, 1];
  for (let jy = 0; jy < grid.ny; jy++) {
    const kyv = ky[jy];
    for (let ix = 0; ix < nkx; ix++) {
      const m = jy * nkx + ix;
      const t = 2 * m;
      if (!kept[m]) {
        out[t] = out[t + 1] = 0;
        continue;
      }
      const q1r = qHat[t],
        q1i = qHat[t + 1],
        q2r = qHat[n + t],
        q2i = qHat[n + t + 1];
      let re: number;
      let im: number;
      if (name === 'q') {
        re = w1 * q1r + w2 * q2r;
        im = w1 * q1i + w2 * q2i;
      } else {
        const br = -(h1 * q1r + h2 * q2r) * ib[m];
        const bi = -(h1 * q1i + h2 * q2i) * ib[m];
        const tr = -(q1r - q2r) * ic[m];
        const ti = -(q1i - q2i) * ic[m];
        const pr = wb * br + wt * tr;
        const pi = wb * bi + wt * ti;
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
      }
      out[t] = re;
      out[t + 1] = im;
    }
  }
}
