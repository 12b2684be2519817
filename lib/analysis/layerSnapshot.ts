import type { FieldName } from '../model/fields';
import { Grid } from '../model/grid';
import { layerFieldSpectrum, type LayerView } from '../model/layerFields';
import type { ModelParams } from '../model/params';
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
