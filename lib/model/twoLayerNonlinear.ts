import { BatchFFT } from './batchFFT';
import { lastStageAddCoupling, lastStageProductsCoupled } from './fusedCoupling';
import { lastStageToBlock, lastStageToTendency, velocitiesFirstStageY } from './fusedStages';
import type { Grid } from './grid';
import { RealTransform2D } from './realTransform2D';
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
 * As in one layer (nonlinearTerm.ts), an evaluation is passes that threads share: `invert` and
 * `toGrid` on kx columns, `products` on grid rows y, `tendency` on kx columns; the arrays they
 * share are `alloc`ated.
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
  /** J(ψ₁, ψ₂) on the grid, its x and y transforms and its single-field block. */
  private readonly coupling: Float64Array;
  private readonly couplingX: BatchFFT;
  private readonly couplingY: BatchFFT;
  private readonly couplingBlock: Float64Array;
  /** −1 on every mode: velocitiesFirstStageY forms −q̂·invK2, here −ψ̂·(−1) = ψ̂ exactly. */
  private readonly minusOne: Float64Array;
  private readonly speeds = new Float64Array(4);

  constructor(grid: Grid, lin: TwoLayerLinearOperator, alloc: Float64Alloc = plainFloat64) {
    if (grid.nx < 8 || grid.ny < 8) throw new RangeError('TwoLayerNonlinearTerm needs at least 8 × 8 points');
    this.grid = grid;
    this.lin = lin;
    this.xf1 = new RealTransform2D(grid, true, alloc);
    this.xf2 = new RealTransform2D(grid, true, alloc);
    this.coupling = alloc(grid.size);
    this.couplingX = new BatchFFT(grid.nx, grid.ny / 2, alloc);
    this.couplingY = new BatchFFT(grid.ny, grid.Kx + 1, alloc);
    this.couplingBlock = alloc(2 * grid.ny * (grid.Kx + 1));
    this.psi1 = alloc(2 * grid.spectralSize);
    this.psi2 = alloc(2 * grid.spectralSize);
    this.minusOne = new Float64Array(grid.spectralSize).fill(-1);
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
    const { Kx, ny } = this.grid;
    this.invert(q1, q2, 0, Kx + 1);
    this.toGrid(0, Kx + 1);
    this.products(0, ny, this.speeds, 0);
    this.maxU1 = this.speeds[0];
    this.maxV1 = this.speeds[1];
    this.maxU2 = this.speeds[2];
    this.maxV2 = this.speeds[3];
    this.tendency(out1, out2, 0, Kx + 1);
  }

  /**
   * On kx columns ix0..ix1 − 1 (after `invert` of those columns): the velocities of both layers
   * into their y transforms' first stages, and through the rest of them onto the work grids.
   */
  toGrid(ix0: number, ix1: number): void {
    const { grid, xf1, xf2 } = this;
    const y1 = xf1.yTransform;
    velocitiesFirstStageY(this.psi1, this.minusOne, grid, y1.firstRadix, y1.cosT, y1.sinT, xf1.block, ix0, ix1);
    xf1.inverseYColumns(ix0, ix1);
    const y2 = xf2.yTransform;
    velocitiesFirstStageY(this.psi2, this.minusOne, grid, y2.firstRadix, y2.cosT, y2.sinT, xf2.block, ix0, ix1);
    xf2.inverseYColumns(ix0, ix1);
  }

  /**
   * On grid rows y0..y1 − 1 (even, as the coupling grid packs rows in pairs): both backward x
   * transforms, whose last stages form the layers' products in place and J(ψ₁, ψ₂) into its own
   * grid (max|u₁|, max|v₁|, max|u₂|, max|v₂| of those rows into speeds from `at`), and the three
   * forward x transforms into their blocks' rows.
   */
  products(y0: number, y1: number, speeds: Float64Array, at: number): void {
    const { grid, xf1, xf2 } = this;
    const W1 = xf1.inverseXRows(y0, y1);
    const W2 = xf2.inverseXRows(y0, y1);
    lastStageProductsCoupled(W1, W2, this.coupling, xf1.xLastRun, speeds, grid.ny, y0, y1, at);
    xf1.forwardXRows(W1, y0, y1);
    xf2.forwardXRows(W2, y0, y1);
    const cx = this.couplingX;
    const X = cx.transformButLast(this.coupling, -1, cx.work, y0 >> 1, y1 >> 1);
    lastStageToBlock(X, this.couplingBlock, grid.nx, grid.ny / 2, grid.Kx, y0 >> 1, y1 >> 1);
  }

  /**
   * On kx columns ix0..ix1 − 1: the forward y transforms' last stages form −J(ψ_i, ζ_i) and add
   * F_i·J(ψ₁, ψ₂) with its sign; the range holding column 0 zeroes the mean and makes that column
   * exactly Hermitian in both outputs.
   */
  tendency(out1: Float64Array, out2: Float64Array, ix0: number, ix1: number): void {
    const { grid, xf1, xf2 } = this;
    const scale = 1 / grid.size;
    lastStageToTendency(xf1.forwardYColumns(ix0, ix1), out1, grid, scale, ix0, ix1);
    lastStageToTendency(xf2.forwardYColumns(ix0, ix1), out2, grid, scale, ix0, ix1);
    const { F1, F2 } = this.lin.coefficients;
    const cy = this.couplingY;
    const block = cy.transformButLast(this.couplingBlock, -1, cy.work, ix0, ix1);
    lastStageAddCoupling(block, out1, out2, grid, -F1 * scale, F2 * scale, ix0, ix1);
    if (!(ix0 === 0 && ix1 > 0)) return;
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
