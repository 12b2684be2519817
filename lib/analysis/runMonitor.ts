import type { StepReport } from '../model/budget';
import type { ModelParams } from '../model/params';
import { BudgetSeries } from './budgetSeries';
import { HovmollerAccumulator } from './hovmoller';
import { JetFinder, type JetReport } from './jets';
import { SnapshotPlan, type GridFields } from './snapshot';
import { StaircaseFitter, type StaircaseFit } from './staircase';
import { ProfileTimeMean, type TimeWindow, type WindowReport } from './timeMean';
import { createZonalMeans, ZonalMeanPlan, type ZonalMeans } from './zonalMean';

/** Least jet prominence (peak over the deeper flank minimum of ū) as a fraction of U_rms. */
export const JET_PROMINENCE_OF_URMS = 0.25;

/** The zonal-mean profiles a run keeps time means of. */
export const MEAN_PROFILES = ['ubar', 'qbar', 'qtot', 'upvp', 'convUpvp', 'vpqp', 'eke', 'dqdy'] as const;
export type MeanProfile = (typeof MEAN_PROFILES)[number];

export interface RunMonitorOptions {
  /** The averaging window of the time means; default the last 1/μ time units (50 when μ = 0). */
  window?: TimeWindow;
  /** Hovmöller columns kept (default 512) and budget samples kept (default 4096). */
  hovmollerCap?: number;
  budgetCap?: number;
}

/**
 * Everything a run accumulates for its diagnostics, fed step by step: the budget series (every step's
 * report), and, at each `sample` call, the zonal means, their time means over the window and the
 * Hovmöller record of ū(y, t). Bounded memory (the caps above); the caller chooses how often to
 * sample (equal intervals in time make the time means time means). Model units throughout.
 */
export class RunMonitor {
  readonly params: ModelParams;
  readonly snap: SnapshotPlan;
  readonly zonal: ZonalMeanPlan;
  readonly budget: BudgetSeries;
  readonly hovmoller: HovmollerAccumulator;
  readonly means: ProfileTimeMean<MeanProfile>;
  readonly window: TimeWindow;
  readonly jetFinder: JetFinder;
  readonly staircase: StaircaseFitter | null;
  /** The zonal means of the last sample, and the time means at the last `meanProfiles` call. */
  readonly latest: ZonalMeans;
  readonly mean: Record<MeanProfile, Float64Array>;
  private readonly fields: GridFields;
  private samples = 0;

  constructor(params: ModelParams, options: RunMonitorOptions = {}) {
    this.params = params;
    this.snap = new SnapshotPlan(params);
    // Band ⌊ny/3⌋: the dealiased eddy fluxes the model's own Jacobian uses (docs/zonalMean.md).
    this.zonal = new ZonalMeanPlan(params, { beta: params.beta, band: Math.floor(params.ny / 3) });
    this.budget = new BudgetSeries(options.budgetCap ?? 4096);
    this.hovmoller = new HovmollerAccumulator(params.ny, params.Ly, options.hovmollerCap ?? 512);
    this.window = options.window ?? { kind: 'last', span: params.mu > 0 ? 1 / params.mu : 50, cap: 256 };
    this.means = new ProfileTimeMean(MEAN_PROFILES, params.ny, this.window);
    this.jetFinder = new JetFinder(params.ny, params.Ly);
    this.staircase = params.beta > 0 ? new StaircaseFitter(params.ny, params.Ly, params.beta) : null;
    this.latest = createZonalMeans(params.ny);
    this.mean = Object.fromEntries(MEAN_PROFILES.map((k) => [k, new Float64Array(params.ny)])) as Record<
      MeanProfile,
      Float64Array
    >;
    this.fields = this.snap.gridFields(new Float64Array(2 * this.snap.grid.spectralSize));
  }

  /** Record one step's budget (call after every step). */
  step(report: StepReport): void {
    this.budget.push(report);
  }

  /** Sample the state at time t: zonal means, their running time mean, the Hovmöller column. */
  sample(qHat: Float64Array, t: number): ZonalMeans {
    this.snap.gridFields(qHat, this.fields);
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

  /** Time-mean profiles over the window into `this.mean`; returns the window actually averaged. */
  meanProfiles(): WindowReport {
    return this.means.mean(this.mean);
  }

  /**
   * Jets and staircase of the time-mean profiles (call `meanProfiles` first). Given the run's rms
   * velocity, a jet must also stand out by JET_PROMINENCE_OF_URMS·U_rms: before jets form, the time
   * mean of an eddy field still has wiggles of a fifth of its own small range, and they are not jets.
   */
  structure(uRms = 0): { jets: JetReport; staircase: StaircaseFit | null } {
    const jets = this.jetFinder.find(this.mean.ubar, { absoluteProminence: JET_PROMINENCE_OF_URMS * uRms });
    return { jets, staircase: this.staircase ? this.staircase.fit(this.mean.qtot) : null };
  }
}
