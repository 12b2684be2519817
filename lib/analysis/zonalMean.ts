import type { GridSpec } from '../model/grid';
import { ProfileFFT } from './profileFFT';
import type { GridFields } from './snapshot';

/**
 * Zonal means and eddy fluxes of one instant, as profiles over the ny grid rows y_j = j·Ly/ny (model
 * units). An overbar is the mean over x along a grid row; a prime the deviation from it.
 */
export interface ZonalMeans {
  /** Zonal-mean zonal velocity ū (length/time). */
  ubar: Float64Array;
  /** Zonal-mean PV anomaly q̄, without βy (1/time). */
  qbar: Float64Array;
  /** Total zonal-mean PV q̄ + βy_j with y_j from 0 to Ly − dy: not periodic, it rises by βLy a period. */
  qtot: Float64Array;
  /** Zonal-mean streamfunction ψ̄ (length²/time). */
  psibar: Float64Array;
  /** Gradient of the total PV, ∂y q̄ + β (1/(length·time)), spectral in y. */
  dqdy: Float64Array;
  /** Eddy momentum flux u′v′ (length²/time²; positive: eastward momentum carried northward). */
  upvp: Float64Array;
  /** Its convergence −∂y(u′v′) (length/time²), the eddy acceleration of ū; spectral in y. */
  convUpvp: Float64Array;
  /** Eddy PV flux v′q′ (length/time²). Equals −∂y(u′v′) (Taylor identity; docs/zonalMean.md). */
  vpqp: Float64Array;
  /** Eddy kinetic energy ½(u′² + v′²) (length²/time²). */
  eke: Float64Array;
  /**
   * The same three eddy products as plain zonal means at each row, before any band limit: what the
   * snapshot fields give when averaged along x, and what Stria's zonal-mean files hold. With a band
   * (Stria's own runs), `upvp`, `vpqp` and `eke` above keep |m| ≤ band of these; their domain means agree.
   */
  upvpPlain: Float64Array;
  vpqpPlain: Float64Array;
  ekePlain: Float64Array;
}

/** Fresh output profiles for ny rows. */
export function createZonalMeans(ny: number): ZonalMeans {
  const f = () => new Float64Array(ny);
  return {
    ubar: f(),
    qbar: f(),
    qtot: f(),
    psibar: f(),
    dqdy: f(),
    upvp: f(),
    convUpvp: f(),
    vpqp: f(),
    eke: f(),
    upvpPlain: f(),
    vpqpPlain: f(),
    ekePlain: f(),
  };
}

export interface ZonalMeanOptions {
  /** β (1/(length·time)), for the total PV q̄ + βy and its gradient. */
  beta: number;
  /**
   * Largest |meridional index| m kept in the eddy-product profiles (u′v′, v′q′, EKE), in dqdy and in
   * −∂y(u′v′); default ny/2 (all). Products of fields that carry |m| ≤ K hold |m| ≤ 2K, which the grid
   * aliases when 2K ≥ ny/2; for Stria states (K = ⌊ny/3⌋, the 2/3 rule) pass band = ⌊ny/3⌋ to get the
   * dealiased fluxes the model's own Jacobian uses, for which the Taylor identity holds to round-off.
   */
  band?: number;
}

/**
 * Plan for the zonal means of gridded fields of one grid (Stria snapshots or a user's own periodic
 * data): the y axis, a profile transform and scratch, built once. `compute` allocates nothing when
 * `out` is given.
 */
export class ZonalMeanPlan {
  readonly nx: number;
  readonly ny: number;
  readonly Lx: number;
  readonly Ly: number;
  readonly beta: number;
  readonly band: number;
  /** Row positions y_j = j·Ly/ny. */
  readonly y: Float64Array;
  private readonly profile: ProfileFFT;

  constructor(spec: GridSpec, options: ZonalMeanOptions) {
    this.nx = spec.nx;
    this.ny = spec.ny;
    this.Lx = spec.Lx;
    this.Ly = spec.Ly;
    if (!Number.isFinite(options.beta)) throw new RangeError(`ZonalMeanPlan: beta = ${options.beta} must be finite`);
    this.beta = options.beta;
    this.band = options.band ?? spec.ny / 2;
    if (!(this.band >= 0)) throw new RangeError(`ZonalMeanPlan: band = ${options.band} must be ≥ 0`);
    this.profile = new ProfileFFT(spec.ny, spec.Ly);
    this.y = new Float64Array(spec.ny);
    for (let j = 0; j < spec.ny; j++) this.y[j] = (j * spec.Ly) / spec.ny;
  }

  /** Zonal means and eddy fluxes of f into out (or fresh profiles); returns out. */
  compute(f: GridFields, out: ZonalMeans = createZonalMeans(this.ny)): ZonalMeans {
    const { nx, ny } = this;
    if (f.nx !== nx || f.ny !== ny || f.Lx !== this.Lx || f.Ly !== this.Ly) {
      throw new RangeError(
        `ZonalMeanPlan: fields are ${f.nx}×${f.ny} on ${f.Lx}×${f.Ly}, the plan is ${nx}×${ny} on ${this.Lx}×${this.Ly}`,
      );
    }
    const { u, v, q, psi } = f;
    const inv = 1 / nx;
    // Stage 1, per row: the means, then the eddy products from deviations (two passes, so no
    // cancellation between mean(uv) and ū·v̄).
    for (let j = 0; j < ny; j++) {
      const r = j * nx;
      let su = 0;
      let sv = 0;
      let sq = 0;
      let sp = 0;
      for (let i = 0; i < nx; i++) {
        su += u[r + i];
        sv += v[r + i];
        sq += q[r + i];
        sp += psi[r + i];
      }
      const ub = su * inv;
      const vb = sv * inv;
      let uv = 0;
      let vq = 0;
      let ke = 0;
      const qb = sq * inv;
      for (let i = 0; i < nx; i++) {
        const up = u[r + i] - ub;
        const vp = v[r + i] - vb;
        uv += up * vp;
        vq += vp * (q[r + i] - qb);
        ke += up * up + vp * vp;
      }
      out.ubar[j] = ub;
      out.qbar[j] = qb;
      out.psibar[j] = sp * inv;
      out.qtot[j] = qb + this.beta * this.y[j];
      out.upvpPlain[j] = uv * inv;
      out.vpqpPlain[j] = vq * inv;
      out.ekePlain[j] = 0.5 * ke * inv;
    }
    // Stage 2: meridional derivatives, spectral (periodic profiles); the band limit, if any.
    const p = this.profile;
    if (this.band < ny / 2) {
      p.truncate(out.upvpPlain, out.upvp, this.band);
      p.truncate(out.vpqpPlain, out.vpqp, this.band);
      p.truncate(out.ekePlain, out.eke, this.band);
    } else {
      out.upvp.set(out.upvpPlain);
      out.vpqp.set(out.vpqpPlain);
      out.eke.set(out.ekePlain);
    }
    p.derivative(out.upvp, out.convUpvp, this.band);
    for (let j = 0; j < ny; j++) out.convUpvp[j] = -out.convUpvp[j];
    p.derivative(out.qbar, out.dqdy, this.band);
    for (let j = 0; j < ny; j++) out.dqdy[j] += this.beta;
    return out;
  }
}
