import { lastStageProducts, lastStageToTendency } from './fusedStages';
import type { Grid } from './grid';
import type { LinearOperator } from './linearOperator';
import type { ModeSlabs } from './modeSlabs';
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
 *
 * An evaluation is three passes, which threads share (docs/threads.md): `toGrid` on a range of kx
 * columns, `products` on a row slab of the transform, `tendency` on a range of kx columns again; each
 * pass must be complete, on every range, before the next starts. `evaluateKept` runs the three on
 * everything, one after the other.
 */
export class NonlinearTerm {
  private readonly grid: Grid;
  private readonly lin: LinearOperator;
  readonly transform: RealTransform2D;
  /** Largest |u| and |v| on the grid in the last evaluation. */
  maxU = 0;
  maxV = 0;
  private readonly speeds = new Float64Array(2);

  constructor(grid: Grid, lin: LinearOperator, xf: RealTransform2D) {
    if (!xf.pruned) throw new RangeError('NonlinearTerm needs the pruned transform');
    if (grid.nx < 8 || grid.ny < 8) throw new RangeError('NonlinearTerm needs at least 8 × 8 points');
    this.grid = grid;
    this.lin = lin;
    this.transform = xf;
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
    const xf = this.transform;
    for (let k = 0; k < xf.columns.length; k++) this.toGrid(qHat, k);
    let maxU = 0;
    let maxV = 0;
    for (let j = 0; j < this.transform.slabs.length; j++) {
      this.products(j, this.speeds, 0);
      maxU = Math.max(maxU, this.speeds[0]);
      maxV = Math.max(maxV, this.speeds[1]);
    }
    this.maxU = maxU;
    this.maxV = maxV;
    for (let k = 0; k < xf.columns.length; k++) this.tendency(out, k);
  }

  /**
   * Pass 1, on the transform's column slab k (its kx columns i0..i1 − 1): the velocities
   * ψ̂ = −q̂/K², û = −i ky ψ̂, v̂ = i kx ψ̂ of those columns of q̂ go straight into the y transform's
   * first stage, and through the rest of it onto the work grid. q̂ in the ordinary layout, or in
   * `layout`'s slabs (modeSlabs.ts).
   */
  toGrid(qHat: Float64Array, k: number, layout: ModeSlabs | null = null): void {
    const at = layout ? layout.origin[k] : 0;
    const stride = layout ? layout.stride[k] : this.grid.nkx;
    this.transform.velocitiesToGridSlab(k, qHat, this.lin.invK2, at, stride);
  }

  /**
   * Pass 2, on the transform's row slab j (realTransform2D.ts): the x transforms there and back; the
   * backward one's last stage forms the products (u, v) → (uv, v² − u²) and the largest |u|, |v| of
   * those rows (into speeds[at], speeds[at + 1]), the forward one's writes the block's rows.
   */
  products(j: number, speeds: Float64Array, at: number): void {
    const xf = this.transform;
    const slab = xf.slabs[j];
    const W = xf.inverseXSlab(j);
    lastStageProducts(W, slab.fft.lastRun, speeds, slab.y1 - slab.y0, 0, slab.y1 - slab.y0, at);
    xf.forwardXSlab(j, W);
  }

  /**
   * Pass 3, on column slab k (kx columns i0..i1 − 1): the y transform's last stage forms
   * −Ĵ = (kx² − ky²)·(uv)^ + kx·ky·(v² − u²)^ on those columns of the kept modes; the slab holding
   * column 0 also zeroes the mean and makes that column exactly Hermitian. `out` in the ordinary
   * layout, or in `layout`'s slabs (modeSlabs.ts).
   */
  tendency(out: Float64Array, k: number, layout: ModeSlabs | null = null): void {
    const { nkx, ny, size } = this.grid;
    const c = this.transform.columns[k];
    const at = layout ? layout.origin[k] : 0;
    const stride = layout ? layout.stride[k] : nkx;
    const Y = this.transform.forwardYSlab(k);
    lastStageToTendency(Y, out, this.grid, 1 / size, c.i0, c.i1, c.i0, c.i1 - c.i0, at, stride);
    if (!(c.i0 === 0 && c.i1 > 0)) return;
    out[at] = out[at + 1] = 0;
    // Exact Hermitian symmetry of the kx = 0 column (round-off differs between ±ky otherwise).
    for (let jy = 1; jy <= this.grid.Ky; jy++) {
      const p = at + 2 * jy * stride;
      const n = at + 2 * (ny - jy) * stride;
      const re = 0.5 * (out[p] + out[n]);
      const im = 0.5 * (out[p + 1] - out[n + 1]);
      out[p] = re;
      out[p + 1] = im;
      out[n] = re;
      out[n + 1] = -im;
    }
  }
}
