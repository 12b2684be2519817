import type { Grid } from './grid';
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

  /**
   * `lin.invK2` is 1/K² of the energy the forcing is normalised on: the model's 1/(k² + k_d²) in one
   * layer, the barotropic 1/k² in two (the forcing adds the same increment to both layers, which
   * changes the barotropic PV alone; its energy is ½|Δq̂|²/k²).
   */
  constructor(grid: Grid, p: ModelParams, lin: { readonly invK2: Float64Array }) {
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

  /**
   * The two-layer kick: the same increment √dt·ξ (the same draws as `kick`) added to q̂₁ and q̂₂, a
   * change of the barotropic PV alone. `injected` gets the change of the two-layer energy
   * E = ½Σ(|h₁q̂₁ + h₂q̂₂|²/k² + h₁h₂|q̂₁ − q̂₂|²/(k² + k_d²)) and of the enstrophy ½Σ(h₁|q̂₁|² + h₂|q̂₂|²),
   * mode by mode from the values before and after (`ib` = 1/k², `ic` = 1/(k² + k_d²)).
   */
  kickBothLayers(
    q1: Float64Array,
    q2: Float64Array,
    dt: number,
    rng: RandomStream,
    layers: { h1: number; h2: number; ib: Float64Array; ic: Float64Array },
    injected: Float64Array,
  ): void {
    const varDt = this.variance * dt;
    const draw = this.draw;
    const { h1, h2, ib, ic } = layers;
    const h12 = h1 * h2;
    let dE = 0;
    let dZ = 0;
    for (let i = 0; i < this.modes.length; i++) {
      const q = this.modes[i];
      rng.complexGaussian(varDt, draw);
      const t = 2 * q;
      const ar0 = q1[t],
        ai0 = q1[t + 1],
        br0 = q2[t],
        bi0 = q2[t + 1];
      const ar1 = ar0 + draw[0],
        ai1 = ai0 + draw[1],
        br1 = br0 + draw[0],
        bi1 = bi0 + draw[1];
      q1[t] = ar1;
      q1[t + 1] = ai1;
      q2[t] = br1;
      q2[t + 1] = bi1;
      const mq = this.mirrors[i];
      if (mq >= 0) {
        q1[2 * mq] = ar1;
        q1[2 * mq + 1] = -ai1;
        q2[2 * mq] = br1;
        q2[2 * mq + 1] = -bi1;
      }
      dE +=
        (sq(h1 * ar1 + h2 * br1, h1 * ai1 + h2 * bi1) - sq(h1 * ar0 + h2 * br0, h1 * ai0 + h2 * bi0)) * ib[q] +
        h12 * (sq(ar1 - br1, ai1 - bi1) - sq(ar0 - br0, ai0 - bi0)) * ic[q];
      dZ += h1 * (sq(ar1, ai1) - sq(ar0, ai0)) + h2 * (sq(br1, bi1) - sq(br0, bi0));
    }
    injected[0] = dE;
    injected[1] = dZ;
  }
}

function sq(re: number, im: number): number {
  return re * re + im * im;
}
