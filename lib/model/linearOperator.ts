import type { Grid } from './grid';
import type { ModelParams } from './params';
import { expPortable } from './portableMath';
import { cisPortable } from './portableTrig';
import { plainFloat64, type Float64Alloc } from './sharedArena';

/** cos and sin of a phase, shared scratch (module level, so no model holds it). */
const phase = new Float64Array(2);

/**
 * The linear part of the PV equation, diagonal in Fourier space: dq̂/dt = L q̂ + …, with
 *   L(k) = −(μ k²/K² + ν k^{2p} + μ_ls·[|k| ≤ k_ls]) + i β kx / K²,   K² = k² + k_d².
 * The imaginary part is the Rossby-wave term (ω = −β kx/K²); the real part the damping. Discarded
 * modes (2/3 rule) and the mean carry L = 0 and a zero propagator, so a step keeps them at zero.
 *
 * `setStep(dt)` fills the propagators exp(L dt/2) and exp(L dt) used by the integrating-factor step;
 * it allocates nothing and is the only costly call (one complex exponential per kept mode, made with
 * portableMath.ts and portableTrig.ts so that the propagators have the same bits on every engine;
 * e^{L dt} is its square). The propagators are `alloc`ated (shared memory when threads share the
 * step, each filling its own columns: `setStepColumns`).
 */
export class LinearOperator {
  readonly grid: Grid;
  /** 1/K² per half-plane mode (0 where not kept): ψ̂ = −q̂/K². */
  readonly invK2: Float64Array;
  /** Damping rates per mode, split by cause (1/time), for the budgets. */
  readonly dragRate: Float64Array;
  readonly hyperRate: Float64Array;
  readonly lsRate: Float64Array;
  /** Wave frequency Im L = β kx/K² per mode. */
  readonly waveRate: Float64Array;
  /** 1 where the mode is kept, else 0. */
  readonly kept: Uint8Array;
  /** Propagators, complex interleaved in the half-plane layout. */
  readonly halfStep: Float64Array;
  readonly fullStep: Float64Array;
  private dt = NaN;

  constructor(grid: Grid, p: ModelParams, alloc: Float64Alloc = plainFloat64) {
    this.grid = grid;
    const n = grid.spectralSize;
    this.invK2 = new Float64Array(n);
    this.dragRate = new Float64Array(n);
    this.hyperRate = new Float64Array(n);
    this.lsRate = new Float64Array(n);
    this.waveRate = new Float64Array(n);
    this.kept = new Uint8Array(n);
    this.halfStep = alloc(2 * n);
    this.fullStep = alloc(2 * n);
    const kd2 = p.kd * p.kd;
    for (let jy = 0; jy < grid.ny; jy++) {
      for (let ix = 0; ix < grid.nkx; ix++) {
        if (!grid.kept(ix, jy)) continue;
        const q = jy * grid.nkx + ix;
        const k2 = grid.k2[q];
        const K2 = k2 + kd2;
        this.kept[q] = 1;
        this.invK2[q] = 1 / K2;
        this.dragRate[q] = (p.mu * k2) / K2;
        this.hyperRate[q] = p.nu * integerPower(k2, p.nu_order);
        this.lsRate[q] = p.mu_ls > 0 && Math.sqrt(k2) <= p.k_ls ? p.mu_ls : 0;
        this.waveRate[q] = (p.beta * grid.kx[ix]) / K2;
      }
    }
  }

  /** Total damping rate −Re L of mode q. */
  rate(q: number): number {
    return this.dragRate[q] + this.hyperRate[q] + this.lsRate[q];
  }

  /** The step the propagators are built for (NaN before the first `setStep`). */
  get step(): number {
    return this.dt;
  }

  /** Fill exp(L dt/2) and exp(L dt); a no-op when dt is unchanged. */
  setStep(dt: number): void {
    if (dt === this.dt) return;
    this.setStepColumns(dt, 0, this.grid.Kx + 1);
    this.builtFor(dt);
  }

  /**
   * Record that the propagators now hold those of dt, after `setStepColumns` filled every column.
   */
  builtFor(dt: number): void {
    this.dt = dt;
  }

  /**
   * Fill exp(L dt/2) and exp(L dt) of the kept modes in columns ix0..ix1 − 1 (a thread's share of
   * `setStep`; every other entry stays zero as made). Does not change `step`: see `builtFor`.
   */
  setStepColumns(dt: number, ix0: number, ix1: number): void {
    const { keptRows, nkx } = this.grid;
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let q = row + ix0; q < row + ix1; q++) {
        if (!this.kept[q]) continue;
        this.fillMode(q, dt);
      }
    }
  }

  private fillMode(q: number, dt: number): void {
    const re = -this.rate(q);
    const im = this.waveRate[q];
    // e^{L dt/2}, and e^{L dt} as its square (one complex product instead of a second exponential).
    const h = expPortable(re * dt * 0.5);
    cisPortable(im * dt * 0.5, phase);
    const hr = h * phase[0];
    const hi = h * phase[1];
    this.halfStep[2 * q] = hr;
    this.halfStep[2 * q + 1] = hi;
    this.fullStep[2 * q] = hr * hr - hi * hi;
    this.fullStep[2 * q + 1] = 2 * hr * hi;
  }
}

/**
 * x^p for a small integer p ≥ 0 by repeated multiplication: correctly rounded products give the same
 * bits on every JavaScript engine, which Math.pow does not promise (runs must match bit for bit in
 * the browser and in Node).
 */
export function integerPower(x: number, p: number): number {
  let r = 1;
  for (let i = 0; i < p; i++) r *= x;
  return r;
}
