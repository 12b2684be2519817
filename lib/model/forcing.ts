import type { Grid } from './grid';
import type { LinearOperator } from './linearOperator';
import type { ModelParams } from './params';
import { RandomStream } from './randomStream';

/**
 * Forcing on the annulus |k − k_f| ≤ δk of kept modes (kx = 0 modes left out when force_zonal is
 * false). The annulus is stored as a list of independent modes: every kept half-plane mode with
 * kx > 0, and for kx = 0 the modes with ky > 0 only; their mirrors (0, −ky) are written as complex
 * conjugates, so the field stays real.
 *
 * Stochastic (white in time): after each deterministic step, q̂ += √dt·ξ with ξ complex Gaussian,
 * E|ξ|² = σ² on every annulus mode. The full-plane energy E = ½Σ|q̂|²/K² then gains, in the
 * ensemble mean and for any dt, exactly ε·dt with σ² = ε / Σ_list 1/K² (each listed mode and its
 * conjugate make 2·½|ξ|²/K²); the enstrophy ½Σ|q̂|² gains η·dt with η = σ²·N_list, = k_f² ε for a
 * thin ring at k_d = 0. (Novikov 1965; ring normalisation as in Srinivasan & Young 2012.)
 *
 * Steady: a fixed pattern F̂ = A e^{iφ} on the annulus, phases φ drawn from the seed. Its strength is
 * set by ε as the rate at which it would inject energy into its own linear response against the
 * linear drag alone, Σ_full |F̂|²/(μ k²) = ε, so A² = ε μ / Σ_full 1/k²; it needs μ > 0.
 */
export class Forcing {
  readonly kind: ModelParams['forcing'];
  /** Independent annulus modes (half-plane indices) and their kx = 0 mirrors (−1 if none). */
  readonly modes: Int32Array;
  readonly mirrors: Int32Array;
  /** Variance σ² of the stochastic increment per unit time (stochastic forcing). */
  readonly variance: number;
  /** Steady pattern F̂ in the half-plane layout (steady forcing), else all zeros. */
  readonly steady: Float64Array;
  private readonly invK2: Float64Array;
  private readonly draw = new Float64Array(2);

  constructor(grid: Grid, p: ModelParams, lin: LinearOperator) {
    this.kind = p.forcing;
    this.invK2 = lin.invK2;
    const modes: number[] = [];
    const mirrors: number[] = [];
    if (p.forcing !== 'none') {
      for (let jy = 0; jy < grid.ny; jy++) {
        const m = grid.rowIndex(jy);
        for (let ix = 0; ix <= grid.Kx; ix++) {
          if (!grid.kept(ix, jy)) continue;
          if (ix === 0 && (m <= 0 || !p.force_zonal)) continue;
          const q = jy * grid.nkx + ix;
          if (Math.abs(Math.sqrt(grid.k2[q]) - p.kf) > p.dkf) continue;
          modes.push(q);
          mirrors.push(ix === 0 ? (grid.ny - jy) * grid.nkx : -1);
        }
      }
    }
    this.modes = Int32Array.from(modes);
    this.mirrors = Int32Array.from(mirrors);
    let sumInvK2 = 0;
    let sumInvk2 = 0;
    for (const q of this.modes) {
      sumInvK2 += lin.invK2[q];
      sumInvk2 += 1 / grid.k2[q];
    }
    this.variance = p.forcing === 'stochastic' && sumInvK2 > 0 ? p.eps / sumInvK2 : 0;
    this.steady = new Float64Array(2 * grid.spectralSize);
    if (p.forcing === 'steady' && this.modes.length > 0) {
      const amp = Math.sqrt((p.eps * p.mu) / (2 * sumInvk2));
      const phases = new RandomStream((p.seed ^ 0x5f3759df) >>> 0);
      const cs = new Float64Array(2);
      for (let i = 0; i < this.modes.length; i++) {
        phases.phase(cs);
        const q = this.modes[i];
        this.steady[2 * q] = amp * cs[0];
        this.steady[2 * q + 1] = amp * cs[1];
        const mq = this.mirrors[i];
        if (mq >= 0) {
          this.steady[2 * mq] = amp * cs[0];
          this.steady[2 * mq + 1] = -amp * cs[1];
        }
      }
    }
  }

  /** Number of independent modes on the annulus. */
  get count(): number {
    return this.modes.length;
  }

  /**
   * Add one stochastic increment of duration dt to qHat and return the energy it put in,
   * ΔE = Σ_list (|q̂ + Δ|² − |q̂|²)/K² (full-plane energy). `injected[0]` gets ΔE, `injected[1]` the
   * enstrophy ΔZ. Draws exactly two uniforms per listed mode, in list order.
   */
  kick(qHat: Float64Array, dt: number, rng: RandomStream, injected: Float64Array): void {
    const varDt = this.variance * dt;
    const draw = this.draw;
    let dE = 0;
    let dZ = 0;
    for (let i = 0; i < this.modes.length; i++) {
      const q = this.modes[i];
      rng.complexGaussian(varDt, draw);
      const re0 = qHat[2 * q];
      const im0 = qHat[2 * q + 1];
      const re1 = re0 + draw[0];
      const im1 = im0 + draw[1];
      qHat[2 * q] = re1;
      qHat[2 * q + 1] = im1;
      const mq = this.mirrors[i];
      if (mq >= 0) {
        qHat[2 * mq] = re1;
        qHat[2 * mq + 1] = -im1;
      }
      const dSq = re1 * re1 + im1 * im1 - re0 * re0 - im0 * im0;
      dE += dSq * this.invK2[q];
      dZ += dSq;
    }
    injected[0] = dE;
    injected[1] = dZ;
  }
}
