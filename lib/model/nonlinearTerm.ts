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
 * The result is exactly zero outside the kept modes. Build once per grid; a call allocates nothing.
 */
export class NonlinearTerm {
  private readonly grid: Grid;
  private readonly lin: LinearOperator;
  private readonly xf: RealTransform2D;
  private readonly uHat: Float64Array;
  private readonly vHat: Float64Array;
  private readonly pHat: Float64Array;
  private readonly sHat: Float64Array;
  /** Grid velocity of the last evaluation (u, v), then reused for the products. */
  readonly u: Float64Array;
  readonly v: Float64Array;
  private readonly p: Float64Array;
  private readonly s: Float64Array;
  /** Largest |u| and |v| on the grid in the last evaluation. */
  maxU = 0;
  maxV = 0;

  constructor(grid: Grid, lin: LinearOperator, xf: RealTransform2D) {
    this.grid = grid;
    this.lin = lin;
    this.xf = xf;
    const ns = 2 * grid.spectralSize;
    this.uHat = new Float64Array(ns);
    this.vHat = new Float64Array(ns);
    this.pHat = new Float64Array(ns);
    this.sHat = new Float64Array(ns);
    this.u = new Float64Array(grid.size);
    this.v = new Float64Array(grid.size);
    this.p = new Float64Array(grid.size);
    this.s = new Float64Array(grid.size);
  }

  /** out ← −J(ψ, q) from qHat; out and qHat must differ. Sets maxU, maxV. */
  evaluate(qHat: Float64Array, out: Float64Array): void {
    const { nkx, Kx, kx, ky, keptRows } = this.grid;
    const invK2 = this.lin.invK2;
    const uHat = this.uHat;
    const vHat = this.vHat;
    // Velocities: ψ̂ = −q̂/K², û = −i ky ψ̂, v̂ = i kx ψ̂.
    for (let r = 0; r < keptRows.length; r++) {
      const jy = keptRows[r];
      const kyv = ky[jy];
      for (let ix = 0; ix <= Kx; ix++) {
        const q = jy * nkx + ix;
        const pr = -qHat[2 * q] * invK2[q];
        const pi = -qHat[2 * q + 1] * invK2[q];
        uHat[2 * q] = kyv * pi;
        uHat[2 * q + 1] = -kyv * pr;
        vHat[2 * q] = -kx[ix] * pi;
        vHat[2 * q + 1] = kx[ix] * pr;
      }
    }
    const u = this.u;
    const v = this.v;
    this.xf.inversePair(uHat, vHat, u, v);
    // Products on the grid, and the largest speeds for the CFL number.
    const p = this.p;
    const s = this.s;
    let mu = 0;
    let mv = 0;
    for (let i = 0; i < u.length; i++) {
      const ui = u[i];
      const vi = v[i];
      p[i] = ui * vi;
      s[i] = vi * vi - ui * ui;
      const au = ui < 0 ? -ui : ui;
      const av = vi < 0 ? -vi : vi;
      if (au > mu) mu = au;
      if (av > mv) mv = av;
    }
    this.maxU = mu;
    this.maxV = mv;
    const pHat = this.pHat;
    const sHat = this.sHat;
    this.xf.forwardPair(p, s, pHat, sHat);
    out.fill(0);
    for (let r = 0; r < keptRows.length; r++) {
      const jy = keptRows[r];
      const kyv = ky[jy];
      for (let ix = 0; ix <= Kx; ix++) {
        const q = jy * nkx + ix;
        const kxv = kx[ix];
        const a = kxv * kxv - kyv * kyv;
        const b = kxv * kyv;
        out[2 * q] = a * pHat[2 * q] + b * sHat[2 * q];
        out[2 * q + 1] = a * pHat[2 * q + 1] + b * sHat[2 * q + 1];
      }
    }
  }
}
