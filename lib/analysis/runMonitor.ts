import type { StepReport } from '../model/budget';
import { twoLayerCoefficients, type ModelParams } from '../model/params';
import { BudgetSeries } from './budgetSeries';
import { HovmollerAccumulator } from './hovmoller';
import { StructureDetector, type JetDetection, type MeanSeries, type StaircaseDetection } from './jetDetector';
import { LayerMonitor } from './layerMonitor';
import { barotropicParams } from './layerSnapshot';
import { SnapshotPlan, type GridFields } from './snapshot';
import { SteadyCriterion } from './steadyCriterion';
import { ProfileTimeMean, type TimeWindow, type WindowReport } from './timeMean';
import { createZonalMeans, ZonalMeanPlan, type ZonalMeans } from './zonalMean';

/** The zonal-mean profiles a run keeps time means of. */
export const MEAN_PROFILES = ['ubar', 'qbar', 'qtot', 'upvp', 'convUpvp', 'vpqp', 'eke', 'dqdy'] as const;
export type MeanProfile = (typeof MEAN_PROFILES)[number];

/** The statistical steady state's test: window length (time units) and relative tolerance (steadyCriterion.ts). */
export interface SteadyTest {
  window: number;
  tolerance: number;
}

/**
 * The memory of the flow the monitor watches (time units; 0 when unknown, without drag): how long its
 * zonal-mean flow takes to forget, the drag's spin-down time. One layer: 1/μ. Two layers: the drag
 * acts on the lower layer only, and the barotropic flow (whose jets the monitor watches) feels it at
 * μh₂: its vorticity equation carries −h₂μζ₂, and ζ₂ = ζ_bt for a barotropic flow [derived:
 * docs/two-layer.md], so the memory is 1/(μh₂), h₂ = H₂/H (twice the drag time for equal layers).
 */
export function flowMemory(p: ModelParams): number {
  if (!(p.mu > 0)) return 0;
  return p.layers === 2 ? 1 / (p.mu * twoLayerCoefficients(p).h2) : 1 / p.mu;
}

/** The default test: windows of the energy's spin-up time, half the flow memory (50 without drag), 5 %. */
export function defaultSteadyTest(p: ModelParams): SteadyTest {
  const memory = flowMemory(p);
  return { window: memory > 0 ? memory / 2 : 50, tolerance: 0.05 };
}

/** The jets and PV staircase of a window's time means, by the one detector (jetDetector.ts). */
export interface Structure {
  jets: JetDetection;
  staircase: StaircaseDetection | null;
}

export interface RunMonitorOptions {
  /** The averaging window of the time means; default the last flow memory, 1/μ in one layer (50 when μ = 0). */
  window?: TimeWindow;
  /** Hovmöller columns kept (default 512) and budget samples kept (default 4096). */
  hovmollerCap?: number;
  budgetCap?: number;
  /** The steady-state test; default defaultSteadyTest. */
  steady?: SteadyTest;
  /** Where the run's clock started (the steady test's first window starts there); default 0. */
  start?: number;
}

/**
 * Everything a run accumulates for its diagnostics, fed step by step: the budget series and the
 * steady-state test (every step's report), and, at each `sample` call, the zonal means, their time
 * means over the window and the Hovmöller record of ū(y, t). Bounded memory (the caps above); the
 * caller chooses how often to sample (equal intervals in time make the time means time means, and
 * the detector's sampling errors right). Model units throughout.
 *
 * Two layers (params.layers = 2; `sample` takes the two-layer state q̂₁, q̂₂): the zonal means, jets,
 * staircase and Hovmöller are those of the barotropic flow ψ_bt = h₁ψ₁ + h₂ψ₂ (`snap` and `zonal` are
 * of barotropicParams: its PV is ζ_bt and its mean PV gradient β, which the staircase uses), with the
 * flow memory 1/(μh₂) of the bottom drag acting on it (flowMemory); `layers` keeps the per-layer zonal
 * means, their time means and the energy cycle (layerMonitor.ts). One-layer parameters (also those
 * of barotropicParams, as the app's worker passes them with the barotropic spectrum) work as before.
 */
export class RunMonitor {
  /** The parameters in force (replaced by `retune`, with the plans below that depend on them). */
  params: ModelParams;
  /** Two layers: the layers' diagnostics (null in one layer). */
  readonly layers: LayerMonitor | null;
  snap: SnapshotPlan;
  zonal: ZonalMeanPlan;
  readonly budget: BudgetSeries;
  readonly hovmoller: HovmollerAccumulator;
  /** The time means over the window (a new, empty one after `setWindow`). */
  means: ProfileTimeMean<MeanProfile>;
  window: TimeWindow;
  steady: SteadyCriterion;
  /** The one detector of jets and staircase steps for this grid (jetDetector.ts). */
  detector: StructureDetector;
  /** The zonal means of the last sample, and the time means at the last `meanProfiles` call. */
  readonly latest: ZonalMeans;
  readonly mean: Record<MeanProfile, Float64Array>;
  private readonly fields: GridFields;
  private samples = 0;

  constructor(params: ModelParams, options: RunMonitorOptions = {}) {
    this.params = params;
    const watched = params.layers === 2 ? barotropicParams(params) : params;
    this.snap = new SnapshotPlan(watched);
    // Band ⌊ny/3⌋: the dealiased eddy fluxes the model's own Jacobian uses (docs/zonalMean.md).
    this.zonal = new ZonalMeanPlan(watched, { beta: params.beta, band: Math.floor(params.ny / 3) });
    this.budget = new BudgetSeries(options.budgetCap ?? 4096);
    this.hovmoller = new HovmollerAccumulator(params.ny, params.Ly, options.hovmollerCap ?? 512);
    const memory = flowMemory(params);
    this.window = options.window ?? { kind: 'last', span: memory > 0 ? memory : 50, cap: 256 };
    this.means = new ProfileTimeMean(MEAN_PROFILES, params.ny, this.window);
    this.layers = params.layers === 2 ? new LayerMonitor(params, this.window, options.budgetCap ?? 4096) : null;
    const test = options.steady ?? defaultSteadyTest(params);
    this.steady = new SteadyCriterion(options.start ?? 0, test.window, test.tolerance);
    this.detector = runDetector(params);
    this.latest = createZonalMeans(params.ny);
    this.mean = Object.fromEntries(MEAN_PROFILES.map((k) => [k, new Float64Array(params.ny)])) as Record<
      MeanProfile,
      Float64Array
    >;
    this.fields = this.snap.gridFields(new Float64Array(2 * this.snap.grid.spectralSize));
  }

  /** Record one step's budget and test for the steady state (call after every step). */
  step(report: StepReport): void {
    this.budget.push(report);
    this.steady.add(report.time - report.dt, report.dt, report.energy.value);
    this.layers?.step(report);
  }

  /**
   * Sample the state at time t (two layers: q̂₁ then q̂₂): zonal means, their running time mean, the
   * Hovmöller column; in two layers those of the barotropic flow, and the layers' own.
   */
  sample(qHat: Float64Array, t: number): ZonalMeans {
    if (this.layers) this.layers.sample(qHat, t, this.fields);
    else this.snap.gridFields(qHat, this.fields);
    this.zonal.compute(this.fields, this.latest);
    this.means.add(t, this.latest);
    this.hovmoller.add(t, this.latest.ubar);
    this.samples++;
    return this.latest;
  }

  /** Number of samples taken. */
  get sampleCount(): number {
    return this.samples;
  }

  /**
   * New parameters on the same grid and domain, from time t on: the record so far (budget series,
   * Hovmöller, time means) is kept, so a change mid-run does not erase the history; the zonal means,
   * the detector and the snapshot plan follow the new β, μ and k_d, and the steady-state test starts
   * again at t (new parameters move the steady state, so it must be reached anew). The time means
   * then mix the two settings until the caller restarts them (`setWindow`). RangeError for another
   * grid or domain, whose profiles would not line up.
   */
  retune(params: ModelParams, t: number, steady: SteadyTest = defaultSteadyTest(params)): void {
    const old = this.params;
    if (params.nx !== old.nx || params.ny !== old.ny || params.Lx !== old.Lx || params.Ly !== old.Ly)
      throw new RangeError('RunMonitor.retune: the grid and domain must stay the same');
    if (params.layers !== old.layers)
      throw new RangeError('RunMonitor.retune: the number of layers must stay the same');
    this.params = params;
    const watched = params.layers === 2 ? barotropicParams(params) : params;
    if (!this.snap.fits(watched)) this.snap = new SnapshotPlan(watched);
    this.zonal = new ZonalMeanPlan(watched, { beta: params.beta, band: Math.floor(params.ny / 3) });
    this.layers?.retune(params);
    this.detector = runDetector(params);
    this.steady = new SteadyCriterion(t, steady.window, steady.tolerance);
  }

  /** A new averaging window: the time means start again from the next sample. */
  setWindow(window: TimeWindow): void {
    this.means = new ProfileTimeMean(MEAN_PROFILES, this.params.ny, window);
    this.layers?.setWindow(window);
    this.window = window;
  }

  /** Time-mean profiles over the window into `this.mean`; returns the window actually averaged. */
  meanProfiles(): WindowReport {
    return this.means.mean(this.mean);
  }

  /** Jets and staircase of the window's time means (into `this.mean.ubar` and `.qtot`); null before the first sample. */
  structure(): Structure | null {
    return structureOf(this.detector, this.means, this.mean);
  }
}

/**
 * The detector of a run's grid: β > 0 enables the staircase (two layers: of the barotropic flow, whose
 * mean PV gradient is β); the flow's memory is flowMemory (the drag time 1/μ in one layer, 1/(μh₂)
 * of the bottom drag on the barotropic flow in two; unknown without drag).
 */
export function runDetector(p: ModelParams): StructureDetector {
  return new StructureDetector(
    { points: p.ny, y0: 0, dy: p.Ly / p.ny, periodic: true },
    { beta: p.beta, memory: flowMemory(p) },
  );
}

/** Jets and staircase of the time means `means` (ū and total PV written into out.ubar and out.qtot). */
export function structureOf(
  detector: StructureDetector,
  means: ProfileTimeMean<MeanProfile>,
  out: Pick<Record<MeanProfile, Float64Array>, 'ubar' | 'qtot'>,
): Structure | null {
  const u: MeanSeries | null = means.series('ubar', out.ubar);
  if (!u) return null;
  const q = detector.fitter ? means.series('qtot', out.qtot) : null;
  return { jets: detector.jets(u), staircase: q ? detector.staircase(q) : null };
}
