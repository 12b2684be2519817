import { fieldSpectrum, type FieldName } from '../model/fields';
import { Grid } from '../model/grid';
import { LinearOperator } from '../model/linearOperator';
import type { ModelParams } from '../model/params';
import { RealTransform2D } from '../model/realTransform2D';

/**
 * One instant of a Stria run, as the analysis sees it: the parameters (model units) and the PV anomaly
 * spectrum q̂ in the half-plane layout of lib/model/grid.ts. Everything else derives from these.
 */
export interface Snapshot {
  params: ModelParams;
  time: number;
  steps: number;
  qHat: Float64Array;
}

/** Gridded fields of one instant (row-major, y slow), the input of the grid-space diagnostics. */
export interface GridFields {
  nx: number;
  ny: number;
  Lx: number;
  Ly: number;
  /** Zonal and meridional velocity, u = −ψ_y, v = ψ_x. */
  u: Float64Array;
  v: Float64Array;
  /** PV anomaly q = ∇²ψ − k_d²ψ (without βy), relative vorticity ζ, streamfunction ψ. */
  q: Float64Array;
  zeta: Float64Array;
  psi: Float64Array;
}

/**
 * Plan objects for analysing snapshots of one grid and parameter set, built once and reused: the
 * grid, the linear operator (1/K², damping rates) and a transform. Derives spectra and gridded fields
 * of a snapshot without touching the stepper.
 */
export class SnapshotPlan {
  readonly params: ModelParams;
  readonly grid: Grid;
  readonly lin: LinearOperator;
  readonly transform: RealTransform2D;
  private readonly spec: Float64Array;

  constructor(params: ModelParams) {
    this.params = params;
    this.grid = new Grid(params);
    this.lin = new LinearOperator(this.grid, params);
    this.transform = new RealTransform2D(this.grid, true);
    this.spec = new Float64Array(2 * this.grid.spectralSize);
  }

  /** True when this plan serves snapshots of these parameters' grid. */
  fits(p: ModelParams): boolean {
    return (
      p.nx === this.params.nx &&
      p.ny === this.params.ny &&
      p.Lx === this.params.Lx &&
      p.Ly === this.params.Ly &&
      p.kd === this.params.kd
    );
  }

  /** Spectrum of a derived field (half-plane layout) into out. */
  spectrum(
    qHat: Float64Array,
    name: FieldName,
    out: Float64Array = new Float64Array(2 * this.grid.spectralSize),
  ): Float64Array {
    fieldSpectrum(name, qHat, this.grid, this.lin, out);
    return out;
  }

  /** A derived field on the grid into out. */
  field(qHat: Float64Array, name: FieldName, out: Float64Array = new Float64Array(this.grid.size)): Float64Array {
    fieldSpectrum(name, qHat, this.grid, this.lin, this.spec);
    this.transform.inverse(this.spec, out);
    return out;
  }

  /** All gridded fields of a snapshot (new arrays unless `into` is given). */
  gridFields(qHat: Float64Array, into?: GridFields): GridFields {
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
    this.field(qHat, 'u', f.u);
    this.field(qHat, 'v', f.v);
    this.field(qHat, 'q', f.q);
    this.field(qHat, 'zeta', f.zeta);
    this.field(qHat, 'psi', f.psi);
    return f;
  }
}
