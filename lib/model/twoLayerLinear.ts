import type { Grid } from './grid';
import { integerPower } from './linearOperator';
import { expComplex2x2 } from './matrixExp2';
import { twoLayerCoefficients, type ModelParams, type TwoLayerCoefficients } from './params';
import { plainFloat64, type Float64Alloc } from './sharedArena';

/**
 * The linear part of the two-layer (Phillips) model, per Fourier mode a 2 × 2 complex matrix acting on
 * (q̂₁, q̂₂): dq̂/dt = L q̂ + …, with (K² = k², kx the zonal wavenumber; docs/two-layer.md)
 *   L = −i kx U − i kx Q A + μ K² E₂₂ A − (ν K^{2p} + μ_ls·[|k| ≤ k_ls]) I,
 * U = diag(U₁, U₂), Q = diag(Q₁, Q₂), E₂₂ = diag(0, 1), and A the PV inversion ψ̂ = A q̂:
 *   ψ̂₁ = ψ̂_bt + h₂ τ̂,  ψ̂₂ = ψ̂_bt − h₁ τ̂,  ψ̂_bt = −(h₁q̂₁ + h₂q̂₂)/K²,  τ̂ = ψ̂₁ − ψ̂₂ = −(q̂₁ − q̂₂)/(K² + k_d²),
 * the barotropic and baroclinic modes (q₁ − q₂ = ∇²τ − k_d²τ; h₁q₁ + h₂q₂ = ∇²ψ_bt since F₁h₁ = F₂h₂).
 * The hyperviscosity acts on q (as in one layer), so it is a multiple of I, like the large-scale drag.
 *
 * `setStep(dt)` fills the propagators e^{L dt/2} and e^{L dt} = (e^{L dt/2})² as 2 × 2 complex
 * matrices, 8 doubles per mode at 8·m (a₁₁, a₁₂, a₂₁, a₂₂, each re, im), by the closed form of
 * matrixExp2.ts: the coupling of the layers by the shear, β, the interface and the drag is integrated
 * exactly, once per dt, with the portable maths. Modes the model does not keep carry zero. The
 * propagators are `alloc`ated (shared memory when threads share the step: `setStepColumns`).
 */
export class TwoLayerLinearOperator {
  readonly grid: Grid;
  readonly coefficients: TwoLayerCoefficients;
  readonly mu: number;
  /** 1/K² and 1/(K² + k_d²) per kept mode, else 0: the barotropic and baroclinic inversions. */
  readonly invK2Barotropic: Float64Array;
  readonly invK2Baroclinic: Float64Array;
  /** Damping rates of q in both layers (1/time): hyperviscosity and large-scale drag. */
  readonly hyperRate: Float64Array;
  readonly lsRate: Float64Array;
  /** 1 where the mode is kept, else 0. */
  readonly kept: Uint8Array;
  /** Propagators e^{L dt/2} and e^{L dt}, 8 doubles per mode. */
  readonly halfStep: Float64Array;
  readonly fullStep: Float64Array;
  private dt = NaN;
  private readonly rate = new Float64Array(8);

  constructor(grid: Grid, p: ModelParams, alloc: Float64Alloc = plainFloat64) {
    this.grid = grid;
    this.coefficients = twoLayerCoefficients(p);
    this.mu = p.mu;
    const n = grid.spectralSize;
    this.invK2Barotropic = new Float64Array(n);
    this.invK2Baroclinic = new Float64Array(n);
    this.hyperRate = new Float64Array(n);
    this.lsRate = new Float64Array(n);
    this.kept = new Uint8Array(n);
    this.halfStep = alloc(8 * n);
    this.fullStep = alloc(8 * n);
    const kd2 = p.kd * p.kd;
    for (let jy = 0; jy < grid.ny; jy++) {
      for (let ix = 0; ix < grid.nkx; ix++) {
        if (!grid.kept(ix, jy)) continue;
        const m = jy * grid.nkx + ix;
        const k2 = grid.k2[m];
        this.kept[m] = 1;
        this.invK2Barotropic[m] = 1 / k2;
        this.invK2Baroclinic[m] = 1 / (k2 + kd2);
        this.hyperRate[m] = p.nu * integerPower(k2, p.nu_order);
        this.lsRate[m] = p.mu_ls > 0 && Math.sqrt(k2) <= p.k_ls ? p.mu_ls : 0;
      }
    }
  }

  /** The step the propagators are built for (NaN before the first `setStep`). */
  get step(): number {
    return this.dt;
  }

  /**
   * L of kept mode m (half-plane index) into out[0..7] (l₁₁, l₁₂, l₂₁, l₂₂, each re, im), 1/time.
   * Zero for a mode the model does not keep.
   */
  rateMatrix(m: number, out: Float64Array): void {
    out.fill(0);
    if (!this.kept[m]) return;
    const { h1, h2, U1, U2, Q1, Q2 } = this.coefficients;
    const g = this.grid;
    const kx = g.kx[m % g.nkx];
    const K2 = g.k2[m];
    const ib = this.invK2Barotropic[m];
    const ic = this.invK2Baroclinic[m];
    // The inversion ψ̂ = A q̂ (real).
    const a11 = -h1 * ib - h2 * ic;
    const a12 = -h2 * ib + h2 * ic;
    const a21 = -h1 * ib + h1 * ic;
    const a22 = -h2 * ib - h1 * ic;
    const damp = this.hyperRate[m] + this.lsRate[m];
    const drag = this.mu * K2;
    out[0] = -damp;
    out[1] = -kx * (U1 + Q1 * a11);
    out[2] = 0;
    out[3] = -kx * Q1 * a12;
    out[4] = drag * a21;
    out[5] = -kx * Q2 * a21;
    out[6] = drag * a22 - damp;
    out[7] = -kx * (U2 + Q2 * a22);
  }

  /** Fill e^{L dt/2} and e^{L dt}; a no-op when dt is unchanged. */
  setStep(dt: number): void {
    if (dt === this.dt) return;
    this.setStepColumns(dt, 0, this.grid.Kx + 1);
    this.builtFor(dt);
  }

  /** Record that the propagators now hold those of dt, after `setStepColumns` filled every column. */
  builtFor(dt: number): void {
    this.dt = dt;
  }

  /**
   * Fill e^{L dt/2} and e^{L dt} of the kept modes in columns ix0..ix1 − 1 (a thread's share of
   * `setStep`; every other entry stays zero as made). Does not change `step`: see `builtFor`.
   */
  setStepColumns(dt: number, ix0: number, ix1: number): void {
    const { keptRows, nkx } = this.grid;
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let m = row + ix0; m < row + ix1; m++) if (this.kept[m]) this.fillMode(m, dt);
    }
  }

  private fillMode(m: number, dt: number): void {
    const r = this.rate;
    const H = this.halfStep;
    const E = this.fullStep;
    const h = 0.5 * dt;
    const o = 8 * m;
    this.rateMatrix(m, r);
    expComplex2x2(h * r[0], h * r[1], h * r[2], h * r[3], h * r[4], h * r[5], h * r[6], h * r[7], H, o);
    // e^{L dt} = (e^{L dt/2})²: one 2 × 2 product instead of a second exponential.
    const p11r = H[o],
      p11i = H[o + 1],
      p12r = H[o + 2],
      p12i = H[o + 3];
    const p21r = H[o + 4],
      p21i = H[o + 5],
      p22r = H[o + 6],
      p22i = H[o + 7];
    E[o] = p11r * p11r - p11i * p11i + (p12r * p21r - p12i * p21i);
    E[o + 1] = 2 * p11r * p11i + (p12r * p21i + p12i * p21r);
    E[o + 2] = p11r * p12r - p11i * p12i + (p12r * p22r - p12i * p22i);
    E[o + 3] = p11r * p12i + p11i * p12r + (p12r * p22i + p12i * p22r);
    E[o + 4] = p21r * p11r - p21i * p11i + (p22r * p21r - p22i * p21i);
    E[o + 5] = p21r * p11i + p21i * p11r + (p22r * p21i + p22i * p21r);
    E[o + 6] = p21r * p12r - p21i * p12i + (p22r * p22r - p22i * p22i);
    E[o + 7] = p21r * p12i + p21i * p12r + 2 * p22r * p22i;
  }
}
