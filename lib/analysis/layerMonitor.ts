import type { StepReport } from '../model/budget';
import { twoLayerCoefficients, type ModelParams, type TwoLayerCoefficients } from '../model/params';
import { CycleSeries } from './cycleSeries';
import { eddyDiffusivity, type EddyDiffusivity } from './eddyDiffusivity';
import { barotropicFields, LayerSnapshotPlan } from './layerSnapshot';
import { createLayerZonalMeans, LayerZonalMeanPlan, type LayerZonalMeans } from './layerZonalMean';
import type { GridFields } from './snapshot';
import { ProfileTimeMean, type TimeWindow, type WindowReport } from './timeMean';

/**
 * The per-layer profiles a two-layer run keeps time means of (suffix 1 the upper layer, 2 the lower;
 * lib/analysis/zonalMean.ts for each, with the layer's mean PV gradient Q_i in place of β): ū_i, the
 * total PV q̄_i + Q_i y and its gradient, u′v′, v′q′ and EKE of each layer, and the eddy heat
 * (interface) flux (v′τ′)‾, τ = ψ₁ − ψ₂. Model units.
 */
export const LAYER_PROFILES = [
  'ubar1',
  'ubar2',
  'qtot1',
  'qtot2',
  'dqdy1',
  'dqdy2',
  'upvp1',
  'upvp2',
  'vpqp1',
  'vpqp2',
  'eke1',
  'eke2',
  'heat',
] as const;
export type LayerProfile = (typeof LAYER_PROFILES)[number];

/** The eddy PV diffusivity of each layer, D_i = −(v′q′)_i/∂y(q̄_i + Q_i y), with today's guard. */
export interface LayerDiffusivities {
  upper: EddyDiffusivity;
  lower: EddyDiffusivity;
}

/**
 * What a RunMonitor keeps of a two-layer run beyond its barotropic flow: the layers' fields at each
 * sample, their zonal means (lib/analysis/layerZonalMean.ts), running time means of LAYER_PROFILES
 * over the monitor's window, and every step's energy cycle and heat flux (CycleSeries). Fields are
 * computed once per sample; `sample` also writes the barotropic flow's fields (h₁f₁ + h₂f₂), which
 * the monitor's one-layer machinery (jets, staircase, Hovmöller) takes. Allocates nothing per sample.
 */
export class LayerMonitor {
  params: ModelParams;
  coefficients: TwoLayerCoefficients;
  plan: LayerSnapshotPlan;
  zonal: LayerZonalMeanPlan;
  readonly cycle: CycleSeries;
  means: ProfileTimeMean<LayerProfile>;
  /** The zonal means of the last sample, and the time means at the last `meanProfiles` call. */
  readonly latest: LayerZonalMeans;
  readonly mean: Record<LayerProfile, Float64Array>;
  private readonly upper: GridFields;
  private readonly lower: GridFields;
  private readonly profiles: Record<LayerProfile, Float64Array>;

  constructor(params: ModelParams, window: TimeWindow, cycleCap = 4096) {
    if (params.layers !== 2) throw new RangeError('LayerMonitor: the parameters are of a one-layer run');
    this.params = params;
    this.coefficients = twoLayerCoefficients(params);
    this.plan = new LayerSnapshotPlan(params);
    this.zonal = layerZonalPlan(this.plan, this.coefficients, params.ny);
    this.cycle = new CycleSeries(cycleCap);
    this.means = new ProfileTimeMean(LAYER_PROFILES, params.ny, window);
    this.latest = createLayerZonalMeans(params.ny);
    this.mean = Object.fromEntries(LAYER_PROFILES.map((k) => [k, new Float64Array(params.ny)])) as Record<
      LayerProfile,
      Float64Array
    >;
    const n = 2 * this.plan.grid.spectralSize;
    const zero = new Float64Array(2 * n);
    this.upper = this.plan.gridFields(zero, 'upper');
    this.lower = this.plan.gridFields(zero, 'lower');
    const z = this.latest;
    this.profiles = {
      ubar1: z.upper.ubar,
      ubar2: z.lower.ubar,
      qtot1: z.upper.qtot,
      qtot2: z.lower.qtot,
      dqdy1: z.upper.dqdy,
      dqdy2: z.lower.dqdy,
      upvp1: z.upper.upvp,
      upvp2: z.lower.upvp,
      vpqp1: z.upper.vpqp,
      vpqp2: z.lower.vpqp,
      eke1: z.upper.eke,
      eke2: z.lower.eke,
      heat: z.heatFlux,
    };
  }

  /**
   * New physical parameters on the same grid (a change mid-run): the plans that depend on them are
   * rebuilt, the time means and the energy cycle's history are kept.
   */
  retune(params: ModelParams): void {
    if (params.layers !== 2 || params.nx !== this.params.nx || params.ny !== this.params.ny)
      throw new RangeError('LayerMonitor.retune: a two-layer run on the same grid only');
    this.params = params;
    this.coefficients = twoLayerCoefficients(params);
    this.plan = new LayerSnapshotPlan(params);
    this.zonal = layerZonalPlan(this.plan, this.coefficients, params.ny);
  }

  /** Record one step's energy cycle. */
  step(report: StepReport): void {
    this.cycle.push(report);
  }

  /**
   * Sample the two-layer state q̂ (q̂₁ then q̂₂) at time t: the layers' zonal means and their running
   * time means; the barotropic flow's fields go into `barotropic`. Returns the zonal means.
   */
  sample(qHat: Float64Array, t: number, barotropic: GridFields): LayerZonalMeans {
    this.plan.gridFields(qHat, 'upper', this.upper);
    this.plan.gridFields(qHat, 'lower', this.lower);
    this.zonal.compute(this.upper, this.lower, this.latest);
    this.means.add(t, this.profiles);
    barotropicFields(this.upper, this.lower, this.coefficients.h1, this.coefficients.h2, barotropic);
    return this.latest;
  }

  /** The layers' fields of the last sample (upper, lower). */
  fields(): { upper: GridFields; lower: GridFields } {
    return { upper: this.upper, lower: this.lower };
  }

  /** A new averaging window (the monitor's): the time means start again from the next sample. */
  setWindow(window: TimeWindow): void {
    this.means = new ProfileTimeMean(LAYER_PROFILES, this.params.ny, window);
  }

  /** Time-mean profiles over the window into `this.mean`. */
  meanProfiles(): WindowReport {
    return this.means.mean(this.mean);
  }

  /**
   * The eddy PV diffusivity of each layer from the window's time-mean profiles (`meanProfiles` first),
   * with the guard of eddyDiffusivity.ts (the gradient floor, 0.1 of its rms by default).
   */
  diffusivities(): LayerDiffusivities {
    const m = this.mean;
    return {
      upper: eddyDiffusivity(m.vpqp1, m.dqdy1, m.eke1),
      lower: eddyDiffusivity(m.vpqp2, m.dqdy2, m.eke2),
    };
  }
}

/** Band ⌊ny/3⌋: the dealiased eddy fluxes of the model's own Jacobian, as in one layer. */
function layerZonalPlan(plan: LayerSnapshotPlan, c: TwoLayerCoefficients, ny: number): LayerZonalMeanPlan {
  return new LayerZonalMeanPlan(plan.grid, { h1: c.h1, h2: c.h2, Q1: c.Q1, Q2: c.Q2, band: Math.floor(ny / 3) });
}
