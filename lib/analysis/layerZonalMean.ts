import type { GridSpec } from '../model/grid';
import { ProfileFFT } from './profileFFT';
import type { GridFields } from './snapshot';
import { createZonalMeans, ZonalMeanPlan, type ZonalMeans } from './zonalMean';

/**
 * Zonal means of a two-layer state: each layer's (zonalMean.ts, with the layer's mean PV gradient
 * Q_i in place of β, so `qtot` and `dqdy` are the layer's total PV and its gradient), their
 * depth-weighted sums and the eddy interface (heat) flux. h_i = H_i/H; τ = ψ₁ − ψ₂. Profiles over the
 * ny grid rows, model units.
 *
 * The layer form of the Taylor identity (docs/two-layer.md): per layer
 *   (v′q′)_i = −∂y(u′v′)_i + F_i (v_i′ψ_j′)‾,
 * the last term the interface form stress, and since F₁h₁ = F₂h₂ and (v₁′ψ₂′ + v₂′ψ₁′)‾ = ∂x(ψ₁′ψ₂′)‾ = 0,
 *   Σ_i h_i (v′q′)_i = −∂y Σ_i h_i (u′v′)_i
 * on any periodic fields: the form stresses cancel in the depth-weighted sum.
 */
export interface LayerZonalMeans {
  upper: ZonalMeans;
  lower: ZonalMeans;
  /** Σ_i h_i (v′q′)_i, the depth-weighted eddy PV flux (length/time²). */
  vpqp: Float64Array;
  /** Σ_i h_i (u′v′)_i, the depth-weighted eddy momentum flux (length²/time²), and −∂y of it. */
  upvp: Float64Array;
  convUpvp: Float64Array;
  /** (v′τ′)‾, the eddy interface (heat) flux (length³/time²); v of the upper layer (either gives it). */
  heatFlux: Float64Array;
  /** The same as a plain zonal mean, before the band limit (what files hold, as for the other eddy products). */
  heatFluxPlain: Float64Array;
}

export function createLayerZonalMeans(ny: number): LayerZonalMeans {
  const f = () => new Float64Array(ny);
  return {
    upper: createZonalMeans(ny),
    lower: createZonalMeans(ny),
    vpqp: f(),
    upvp: f(),
    convUpvp: f(),
    heatFlux: f(),
    heatFluxPlain: f(),
  };
}

export interface LayerZonalMeanOptions {
  /** Fractional depths h₁ = H₁/H, h₂ = H₂/H. */
  h1: number;
  h2: number;
  /** Mean PV gradients of the layers, Q₁ = β + F₁(U₁ − U₂), Q₂ = β − F₂(U₁ − U₂) (lib/model/params.ts). */
  Q1: number;
  Q2: number;
  /** Band limit of the eddy-product profiles, as in ZonalMeanOptions (⌊ny/3⌋ for Stria states). */
  band?: number;
}

/** Plan for the zonal means of two-layer fields of one grid; `compute` allocates nothing when `out` is given. */
export class LayerZonalMeanPlan {
  readonly ny: number;
  readonly band: number;
  private readonly upper: ZonalMeanPlan;
  private readonly lower: ZonalMeanPlan;
  private readonly profile: ProfileFFT;
  private readonly h1: number;
  private readonly h2: number;

  constructor(spec: GridSpec, options: LayerZonalMeanOptions) {
    this.ny = spec.ny;
    this.h1 = options.h1;
    this.h2 = options.h2;
    this.upper = new ZonalMeanPlan(spec, { beta: options.Q1, band: options.band });
    this.lower = new ZonalMeanPlan(spec, { beta: options.Q2, band: options.band });
    this.band = this.upper.band;
    this.profile = new ProfileFFT(spec.ny, spec.Ly);
  }

  /** Zonal means of the upper and lower layer's fields into out (or fresh profiles). */
  compute(
    upper: GridFields,
    lower: GridFields,
    out: LayerZonalMeans = createLayerZonalMeans(this.ny),
  ): LayerZonalMeans {
    this.upper.compute(upper, out.upper);
    this.lower.compute(lower, out.lower);
    const { h1, h2, ny } = this;
    const nx = upper.nx;
    const inv = 1 / nx;
    for (let j = 0; j < ny; j++) {
      out.vpqp[j] = h1 * out.upper.vpqp[j] + h2 * out.lower.vpqp[j];
      out.upvp[j] = h1 * out.upper.upvp[j] + h2 * out.lower.upvp[j];
      // (v₁′τ′)‾ from deviations, two passes as in zonalMean.ts.
      const r = j * nx;
      let sv = 0;
      let st = 0;
      for (let i = 0; i < nx; i++) {
        sv += upper.v[r + i];
        st += upper.psi[r + i] - lower.psi[r + i];
      }
      const vb = sv * inv;
      const tb = st * inv;
      let vt = 0;
      for (let i = 0; i < nx; i++) vt += (upper.v[r + i] - vb) * (upper.psi[r + i] - lower.psi[r + i] - tb);
      out.heatFluxPlain[j] = vt * inv;
    }
    if (this.band < ny / 2) this.profile.truncate(out.heatFluxPlain, out.heatFlux, this.band);
    else out.heatFlux.set(out.heatFluxPlain);
    this.profile.derivative(out.upvp, out.convUpvp, this.band);
    for (let j = 0; j < ny; j++) out.convUpvp[j] = -out.convUpvp[j];
    return out;
  }
}
