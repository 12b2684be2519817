import { BatchFFT } from './batchFFT';
import { lastStageAddCoupling, lastStageProductsCoupled } from './fusedCoupling';
import { lastStageToBlock, lastStageToTendency } from './fusedStages';
import type { Grid } from './grid';
import { columnSlabLayout, RealTransform2D } from './realTransform2D';
import type { ColumnSlabLayout } from './fusedStages';
import { plainFloat64, type Float64Alloc } from './sharedArena';
import type { TwoLayerLinearOperator } from './twoLayerLinear';

/**
 * The dealiased advection terms −J(ψ_i, q_i) of both layers of the two-layer model, from (q̂₁, q̂₂).
 *
 * q₁ = ζ₁ + F₁(ψ₂ − ψ₁) and J(ψ₁, ψ₁) = 0, so J(ψ₁, q₁) = J(ψ₁, ζ₁) + F₁ J(ψ₁, ψ₂), and likewise
 * J(ψ₂, q₂) = J(ψ₂, ζ₂) − F₂ J(ψ₁, ψ₂). Each J(ψ_i, ζ_i) is formed as in one layer (nonlinearTerm.ts:
 * (∂xx − ∂yy)(u_i v_i) + ∂x∂y(v_i² − u_i²), docs/fused-step.md), with the same fused stages; the
 * interface term needs both layers' velocities at once, J(ψ₁, ψ₂) = ψ₁ₓψ₂ᵧ − ψ₁ᵧψ₂ₓ = u₁v₂ − u₂v₁,
 * a fifth grid product, real, with a transform of half the size of a pair's: read as nx × ny/2
 * complex values, the real grid X (x-major, (x, y) at x·ny + y) packs its rows 2y′ and 2y′ + 1 as one
 * complex number, so its x transform runs over ny/2 columns, and `lastStageToBlock`, which unpacks
 * two real fields a + ib, writes rows 2y′ (a) and 2y′ + 1 (b) of a single-field block of width
 * Kx + 1, which the y transform takes over Kx + 1 columns. Per evaluation: two inverse pair transforms
 * (u_i, v_i), two forward ones (the layers' products) and half of one (J(ψ₁, ψ₂)), against one and
 * one in one layer. Products of kept modes alias only onto discarded ones (2/3 rule), so on the
 * kept modes the result is the Galerkin-truncated term, which conserves the two-layer energy and
 * potential enstrophy.
 *
 * ψ̂_i come from the barotropic and baroclinic inversions (twoLayerLinear.ts) and are kept in `psi1`,
 * `psi2` for the caller (the stepper's budget). Build once per grid; a call allocates nothing.
 *
 * As in one layer (nonlinearTerm.ts), an evaluation is passes that threads share: `invert` on kx
 * columns and `toGrid` on column slabs, `products` on row slabs, `tendency` on column slabs; the
 * arrays they share are `alloc`ated.
 */
export class TwoLayerNonlinearTerm {
  /** ψ̂₁, ψ̂₂ of the last evaluation (kept modes; zero elsewhere). */
  readonly psi1: Float64Array;
  readonly psi2: Float64Array;
  /** Largest |u_i| and |v_i| on the grid in the last evaluation, per layer. */
  maxU1 = 0;
  maxV1 = 0;
  maxU2 = 0;
  maxV2 = 0;
  private readonly grid: Grid;
  private readonly lin: TwoLayerLinearOperator;
  private readonly xf1: RealTransform2D;
  private readonly xf2: RealTransform2D;
  /**
   * J(ψ₁, ψ₂) on the grid, its x and y transforms and its single-field block; cut into the layers'
   * row and column slabs (realTransform2D.ts) when the step is built for threads: the grid slab j
   * holds rows y0..y1 − 1 of the layers' slab j, x-major among themselves, and the block slab k the
   * columns i0..i1 − 1 of their slab k.
   */
  private readonly coupling: Float64Array;
  private readonly couplingX: BatchFFT;
  private readonly couplingY: BatchFFT;
  private readonly couplingBlock: Float64Array;
  private readonly couplingRows: { grid: Float64Array; scratch: Float64Array; fft: BatchFFT }[];
  private readonly couplingColumns: { block: Float64Array; scratch: Float64Array; fft: BatchFFT }[];
  /** Where the coupling block's columns live when it is cut (lastStageToBlock); null for one slab. */
  private readonly couplingLayout: ColumnSlabLayout | null;
  /** −1 on every mode: velocitiesFirstStageY forms −q̂·invK2, here −ψ̂·(−1) = ψ̂ exactly. */
  private readonly minusOne: Float64Array;
  private readonly speeds = new Float64Array(4);

  /** `slabs`: one per thread of the step's team (realTransform2D.ts); 1 keeps every array whole. */
  constructor(grid: Grid, lin: TwoLayerLinearOperator, alloc: Float64Alloc = plainFloat64, slabs = 1) {
    if (grid.nx < 8 || grid.ny < 8) throw new RangeError('TwoLayerNonlinearTerm needs at least 8 × 8 points');
    this.grid = grid;
    this.lin = lin;
    this.xf1 = new RealTransform2D(grid, true, alloc, slabs);
    this.xf2 = new RealTransform2D(grid, true, alloc, slabs);
    this.coupling = alloc(grid.size);
    this.couplingX = new BatchFFT(grid.nx, grid.ny / 2, alloc);
    this.couplingY = new BatchFFT(grid.ny, grid.Kx + 1, alloc);
    this.couplingBlock = alloc(2 * grid.ny * (grid.Kx + 1));
    const { nx, ny } = grid;
    // Rows come in pairs (y0, y1 even: ROW_UNIT), as the coupling grid packs them.
    this.couplingRows = this.xf1.slabs.map(({ y0, y1 }) => {
      const [from, to] = [nx * y0, nx * y1];
      const scratch = this.couplingX.work.subarray(from, to);
      const fft = slabs === 1 ? this.couplingX : new BatchFFT(nx, (y1 - y0) >> 1, () => scratch);
      return { grid: this.coupling.subarray(from, to), scratch, fft };
    });
    this.couplingColumns = this.xf1.columns.map(({ i0, i1 }) => {
      const [from, to] = [2 * ny * i0, 2 * ny * i1];
      const scratch = this.couplingY.work.subarray(from, to);
      const fft = slabs === 1 ? this.couplingY : new BatchFFT(ny, i1 - i0, () => scratch);
      return { block: this.couplingBlock.subarray(from, to), scratch, fft };
    });
    // The coupling block read as a pair block of ny/2 rows (rows 2y′ and 2y′ + 1 as fields a and b).
    this.couplingLayout = slabs === 1 ? null : columnSlabLayout(nx, ny / 2, this.xf1.columns);
    this.psi1 = alloc(2 * grid.spectralSize);
    this.psi2 = alloc(2 * grid.spectralSize);
    this.minusOne = new Float64Array(grid.spectralSize).fill(-1);
  }

  /** Slabs the transforms are cut into (realTransform2D.ts). */
  get slabCount(): number {
    return this.xf1.columns.length;
  }

  /** The kx columns i0..i1 − 1 of column slab k. */
  columnSlab(k: number): { i0: number; i1: number } {
    return this.xf1.columns[k];
  }

  /** out1, out2 ← −J(ψ₁, q₁), −J(ψ₂, q₂), every entry written; outputs must differ from the inputs. */
  evaluate(q1: Float64Array, q2: Float64Array, out1: Float64Array, out2: Float64Array): void {
    out1.fill(0);
    out2.fill(0);
    this.evaluateKept(q1, q2, out1, out2);
  }

  /**
   * As `evaluate`, but writes the kept modes only and leaves every other entry of out1, out2 as it is
   * (for buffers that are zero there and stay so, as the stepper's stage buffers).
   */
  evaluateKept(q1: Float64Array, q2: Float64Array, out1: Float64Array, out2: Float64Array): void {
    const { Kx } = this.grid;
    const slabs = this.xf1.columns.length;
    this.invert(q1, q2, 0, Kx + 1);
    for (let k = 0; k < slabs; k++) this.toGrid(k);
    this.maxU1 = this.maxV1 = this.maxU2 = this.maxV2 = 0;
    for (let j = 0; j < slabs; j++) {
      this.products(j, this.speeds, 0);
      this.maxU1 = Math.max(this.maxU1, this.speeds[0]);
      this.maxV1 = Math.max(this.maxV1, this.speeds[1]);
      this.maxU2 = Math.max(this.maxU2, this.speeds[2]);
      this.maxV2 = Math.max(this.maxV2, this.speeds[3]);
    }
    for (let k = 0; k < slabs; k++) this.tendency(out1, out2, k);
  }

  /**
   * On column slab k of the layers' transforms (after `invert` of its columns): the velocities of
   * both layers into their y transforms' first stages, and through the rest of them onto the work
   * grids.
   */
  toGrid(k: number): void {
    this.xf1.velocitiesToGridSlab(k, this.psi1, this.minusOne);
    this.xf2.velocitiesToGridSlab(k, this.psi2, this.minusOne);
  }

  /**
   * On row slab j of the layers' work grids (its rows even, as the coupling grid packs rows in
   * pairs): both backward x transforms, whose last stages form the layers' products in place and
   * J(ψ₁, ψ₂) into its own grid (max|u₁|, max|v₁|, max|u₂|, max|v₂| of those rows into speeds from
   * `at`), and the three forward x transforms into their blocks' rows.
   */
  products(j: number, speeds: Float64Array, at: number): void {
    const { grid, xf1, xf2 } = this;
    const { y0, y1, fft } = xf1.slabs[j];
    const rows = y1 - y0;
    const W1 = xf1.inverseXSlab(j);
    const W2 = xf2.inverseXSlab(j);
    const c = this.couplingRows[j];
    lastStageProductsCoupled(W1, W2, c.grid, fft.lastRun, speeds, rows, 0, rows, at);
    xf1.forwardXSlab(j, W1);
    xf2.forwardXSlab(j, W2);
    const X = c.fft.transformButLast(c.grid, -1, c.scratch);
    const { nx, ny, Kx } = grid;
    lastStageToBlock(X, this.couplingBlock, nx, ny / 2, Kx, y0 >> 1, y1 >> 1, rows >> 1, y0 >> 1, this.couplingLayout);
  }

  /**
   * On column slab k: the forward y transforms' last stages form −J(ψ_i, ζ_i) and add F_i·J(ψ₁, ψ₂)
   * with its sign; the slab holding column 0 zeroes the mean and makes that column exactly
   * Hermitian in both outputs.
   */
  tendency(out1: Float64Array, out2: Float64Array, k: number): void {
    const { grid, xf1, xf2 } = this;
    const { i0, i1 } = xf1.columns[k];
    const w = i1 - i0;
    const scale = 1 / grid.size;
    lastStageToTendency(xf1.forwardYSlab(k), out1, grid, scale, i0, i1, i0, w);
    lastStageToTendency(xf2.forwardYSlab(k), out2, grid, scale, i0, i1, i0, w);
    const { F1, F2 } = this.lin.coefficients;
    const c = this.couplingColumns[k];
    const block = c.fft.transformButLast(c.block, -1, c.scratch);
    lastStageAddCoupling(block, out1, out2, grid, -F1 * scale, F2 * scale, i0, i1, i0, w);
    if (!(i0 === 0 && i1 > 0)) return;
    hermitianColumn(out1, grid);
    hermitianColumn(out2, grid);
  }

  /** ψ̂₁, ψ̂₂ from q̂₁, q̂₂ on the kept modes of columns ix0..ix1 − 1: ψ_bt + h₂τ and ψ_bt − h₁τ. */
  invert(q1: Float64Array, q2: Float64Array, ix0: number, ix1: number): void {
    const { nkx, keptRows } = this.grid;
    const { h1, h2 } = this.lin.coefficients;
    const ib = this.lin.invK2Barotropic;
    const ic = this.lin.invK2Baroclinic;
    const p1 = this.psi1;
    const p2 = this.psi2;
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let ix = ix0; ix < ix1; ix++) {
        const m = row + ix;
        const t = 2 * m;
        const btr = -(h1 * q1[t] + h2 * q2[t]) * ib[m];
        const bti = -(h1 * q1[t + 1] + h2 * q2[t + 1]) * ib[m];
        const tr = -(q1[t] - q2[t]) * ic[m];
        const ti = -(q1[t + 1] - q2[t + 1]) * ic[m];
        p1[t] = btr + h2 * tr;
        p1[t + 1] = bti + h2 * ti;
        p2[t] = btr - h1 * tr;
        p2[t + 1] = bti - h1 * ti;
      }
    }
  }
}

/** The mean set to zero and the kx = 0 column made exactly Hermitian (as NonlinearTerm does). */
function hermitianColumn(out: Float64Array, grid: Grid): void {
  const { nkx, ny, Ky } = grid;
  out[0] = out[1] = 0;
  for (let jy = 1; jy <= Ky; jy++) {
    const p = 2 * jy * nkx;
    const n = 2 * (ny - jy) * nkx;
    const re = 0.5 * (out[p] + out[n]);
    const im = 0.5 * (out[p + 1] - out[n + 1]);
    out[p] = re;
    out[p + 1] = im;
    out[n] = re;
    out[n + 1] = -im;
  }
}
