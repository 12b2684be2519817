import { lastStageProducts, lastStageToTendency, velocitiesFirstStageY } from './fusedStages';
import type { Grid } from './grid';
import type { LinearOperator } from './linearOperator';
import type { RealTransform2D } from './realTransform2D';

/**
 * The dealiased advection term −J(ψ, q) in the half-plane layout, from q̂.
 *
 * J(ψ, q) = J(ψ, ζ − k_d²ψ) = J(ψ, ζ), and for a non-divergent u = (−ψ_y, ψ_x)
 *   J(ψ, ζ) = ∂x(uζ) + ∂y(vζ) = (∂xx − ∂yy)(uv) + ∂x∂y(v² − u²),
 * an identity of trigonometric polynomials, so with the 2/3 rule it equals the dealiased u·∇ζ to
 * round-off. It needs only u and v on the grid (one inverse pair) and the products uv and v² − u²
 * back (one forward pair): 4 real transforms instead of 5. In Fourier space
 *   −Ĵ = (kx² − ky²)·(uv)^ + kx·ky·(v² − u²)^.
 * The velocities are written straight into the transform's block and the products formed in place on
 * its work grid, so no stage copies a field. The result is exactly zero outside the kept modes and
 * exactly Hermitian in the kx = 0 column. Build once per grid; a call allocates nothing.
 * The derivation and the passes in order, plain and fused: docs/fused-step.md.
 */
export class NonlinearTerm {
  private readonly grid: Grid;
  private readonly lin: LinearOperator;
  private readonly xf: RealTransform2D;
  /** Largest |u| and |v| on the grid in the last evaluation. */
  maxU = 0;
  maxV = 0;
  private readonly speeds = new Float64Array(2);

  constructor(grid: Grid, lin: LinearOperator, xf: RealTransform2D) {
    if (!xf.pruned) throw new RangeError('NonlinearTerm needs the pruned transform');
    if (grid.nx < 8 || grid.ny < 8) throw new RangeError('NonlinearTerm needs at least 8 × 8 points');
    this.grid = grid;
    this.lin = lin;
    this.xf = xf;
  }

  /** out ← −J(ψ, q) from qHat, every entry written; out and qHat must differ. Sets maxU, maxV. */
  evaluate(qHat: Float64Array, out: Float64Array): void {
    out.fill(0);
    this.evaluateKept(qHat, out);
  }

  /**
   * As `evaluate`, but writes the kept modes only and leaves every other entry of out as it is: for
   * buffers whose other entries are zero and stay so (the stepper's stage buffers), which saves a
   * pass over the whole spectrum per stage.
   */
  evaluateKept(qHat: Float64Array, out: Float64Array): void {
    const { nkx, ny, size } = this.grid;
    const xf = this.xf;
    // The velocities ψ̂ = −q̂/K², û = −i ky ψ̂, v̂ = i kx ψ̂ go straight into the y transform's first stage.
    const yFFT = xf.yTransform;
    velocitiesFirstStageY(qHat, this.lin.invK2, this.grid, yFFT.firstRadix, yFFT.cosT, yFFT.sinT, xf.block);
    // The x transform's last stage forms the products (u, v) → (uv, v² − u²) and the largest speeds.
    const W = xf.inverseFirstStageDoneButLast();
    lastStageProducts(W, xf.xLastRun, this.speeds);
    this.maxU = this.speeds[0];
    this.maxV = this.speeds[1];
    // The y transform's last stage forms −Ĵ = (kx² − ky²)·(uv)^ + kx·ky·(v² − u²)^ on the kept modes.
    lastStageToTendency(yFFT.transformButLast(xf.forwardToBlockButY(W), -1), out, this.grid, 1 / size);
    out[0] = out[1] = 0;
    // Exact Hermitian symmetry of the kx = 0 column (round-off differs between ±ky otherwise).
    for (let jy = 1; jy <= this.grid.Ky; jy++) {
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
}
