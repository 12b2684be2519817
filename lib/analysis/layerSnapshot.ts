import type { FieldName } from '../model/fields';
import { Grid } from '../model/grid';
import { layerFieldSpectrum, type LayerView } from '../model/layerFields';
import { ONE_LAYER_VALUES, type ModelParams } from '../model/params';
import { RealTransform2D } from '../model/realTransform2D';
import { TwoLayerLinearOperator } from '../model/twoLayerLinear';
import type { GridFields } from './snapshot';

/**
 * Plan objects for the gridded fields of two-layer snapshots (params.layers = 2; the state q̂₁ then
 * q̂₂ in the half-plane layout of lib/model/grid.ts): the grid, the two-layer inversion and a
 * transform, built once. Each view (a layer, the barotropic or the baroclinic flow; layerFields.ts)
 * gives the GridFields the one-layer diagnostics take. The barotropic view's `q` is its relative
 * vorticity.
 */
export class LayerSnapshotPlan {
  readonly params: ModelParams;
  readonly grid: Grid;
  readonly lin: TwoLayerLinearOperator;
  readonly transform: RealTransform2D;
  private readonly spec: Float64Array;

  constructor(params: ModelParams) {
    if (params.layers !== 2) throw new RangeError('LayerSnapshotPlan: the parameters are of a one-layer run');
    this.params = params;
    this.grid = new Grid(params);
    this.lin = new TwoLayerLinearOperator(this.grid, params);
    this.transform = new RealTransform2D(this.grid, true);
    this.spec = new Float64Array(2 * this.grid.spectralSize);
  }

  /** A field of a view on the grid (row-major, y slow) into out. */
  field(
    qHat: Float64Array,
    name: FieldName,
    view: LayerView,
    out: Float64Array = new Float64Array(this.grid.size),
  ): Float64Array {
    if (qHat.length !== 4 * this.grid.spectralSize)
      throw new RangeError(
        `LayerSnapshotPlan: expected a two-layer state of ${4 * this.grid.spectralSize} values, got ${qHat.length}`,
      );
    layerFieldSpectrum(name, view, qHat, this.grid, this.lin, this.spec);
    this.transform.inverse(this.spec, out);
    return out;
  }

  /** All gridded fields of a view (new arrays unless `into` is given). */
  gridFields(qHat: Float64Array, view: LayerView, into?: GridFields): GridFields {
    const { nx, ny, Lx, Ly, size } = this.grid;
    const f: GridFields = into ?? {
      nx,
      ny,
      Lx,
      Ly,
      u: new Float64Array(size),
      v: new Float64Array(size),
      q: new Float64Array(size),
      zeta: new Float64Array(size),
      psi: new Float64Array(size),
    };
    for (const name of ['u', 'v', 'q', 'zeta', 'psi'] as const) this.field(qHat, name, view, f[name]);
    return f;
  }
}

/**
 * The barotropic flow of a two-layer run as a one-layer flow: the run's parameters with the layer
 * keys at their one-layer values and k_d = 0. Its PV h₁q₁ + h₂q₂ = ∇²ψ_bt is its relative vorticity
 * and its mean PV gradient h₁Q₁ + h₂Q₂ = β (the shear terms cancel, F₁h₁ = F₂h₂), so the one-layer
 * diagnostics (zonal means, jets, staircase, Hovmöller, spectra) apply to it as they stand.
 */
export function barotropicParams(p: ModelParams): ModelParams {
  return { ...p, ...ONE_LAYER_VALUES, kd: 0 };
}

/**
 * The barotropic flow's fields from the layers' (the views are linear: f_bt = h₁f₁ + h₂f₂), into out;
 * its `q` is h₁q₁ + h₂q₂ = ζ_bt. Allocates nothing.
 */
export function barotropicFields(upper: GridFields, lower: GridFields, h1: number, h2: number, out: GridFields): void {
  for (const name of ['u', 'v', 'q', 'zeta', 'psi'] as const) {
    const a = upper[name];
    const b = lower[name];
    const o = out[name];
    for (let i = 0; i < o.length; i++) o[i] = h1 * a[i] + h2 * b[i];
  }
}
