import type { JetReport } from '../lib/analysis/jets';
import { MEAN_PROFILES, RunMonitor, type MeanProfile } from '../lib/analysis/runMonitor';
import type { StaircaseFit } from '../lib/analysis/staircase';
import { summarize, type RunSummary } from '../lib/analysis/summary';
import { ProfileTimeMean, type WindowReport } from '../lib/analysis/timeMean';
import type { Model } from '../lib/model/model';
import type { ModelParams } from '../lib/model/params';
import { monitoredParams, monitoredState } from '../lib/run/monitoredRun';
import type { MonitorStatus } from './diagnosticsApi';
import { SpectralDiagnostics } from './spectralDiagnostics';
import { ZonalFrameStore } from './zonalFrameStore';

/** The settings of one run's diagnostics, resolved to numbers (model time units). */
export interface Sampling {
  sampleEvery: number;
  meanSpan: number;
  spectralAverage: number;
}

/** Default sample interval: 20 of the largest steps, at most 0.5 T, at least one step. */
export function defaultSampleEvery(p: ModelParams): number {
  return Math.max(p.dt, Math.min(0.5, 20 * p.dt));
}

/** Default averaging window: 1/μ (the drag time), or 50 without drag, as the RunMonitor's. */
export function defaultMeanSpan(p: ModelParams): number {
  return p.mu > 0 ? 1 / p.mu : 50;
}

export const DEFAULT_SPECTRAL_AVERAGE = 16;

/**
 * What the worker measures of one run between two restarts: a RunMonitor fed every step and
 * sampled at t₀ + n·sampleEvery (the first step ending at or after each, as the command line does),
 * a time mean over the chosen window for the views (the monitor's own window, fixed at the start,
 * is the run summary's), the zonal-mean frames for export, and spectra and fluxes when asked for.
 */
export class RunDiagnostics {
  readonly monitor: RunMonitor;
  readonly frames: ZonalFrameStore;
  readonly spectral: SpectralDiagnostics;
  readonly since: number;
  private viewMean: ProfileTimeMean<MeanProfile>;
  readonly mean: Record<MeanProfile, Float64Array>;
  private taken = 0;
  private barotropic: Float64Array | undefined;
  private next: number;
  /** Window, jets and staircase of the time mean at the last sample. */
  window: WindowReport | null = null;
  meanJets: JetReport | null = null;
  latestJets: JetReport | null = null;
  staircase: StaircaseFit | null = null;
  lastSample: number | null = null;

  constructor(
    readonly params: ModelParams,
    start: number,
    readonly sampling: Sampling,
  ) {
    this.since = start;
    this.next = start + sampling.sampleEvery;
    // Two layers: the diagnostics watch the barotropic flow until they learn the layers (monitoredParams).
    this.monitor = new RunMonitor(monitoredParams(params), {
      window: { kind: 'last', span: sampling.meanSpan, cap: 256 },
    });
    this.viewMean = this.newMean(sampling.meanSpan);
    this.mean = Object.fromEntries(MEAN_PROFILES.map((k) => [k, new Float64Array(params.ny)])) as Record<
      MeanProfile,
      Float64Array
    >;
    this.frames = new ZonalFrameStore(params.ny);
    this.spectral = new SpectralDiagnostics(this.monitor.snap, sampling.spectralAverage);
  }

  private newMean(span: number): ProfileTimeMean<MeanProfile> {
    return new ProfileTimeMean(MEAN_PROFILES, this.params.ny, { kind: 'last', span, cap: 256 });
  }

  /** The spectrum the diagnostics read: the model's state, or with two layers its barotropic PV. */
  sampled(model: Model): Float64Array {
    const q = monitoredState(model, this.barotropic);
    if (q !== model.qHat) this.barotropic = q;
    return q;
  }

  get samples(): number {
    return this.taken;
  }

  /** Record the step just taken; returns true when it was also a sample time. */
  afterStep(model: Model, wants: { spectra: boolean; spectra2d: boolean; flux: boolean }): boolean {
    this.monitor.step(model.report);
    if (model.time < this.next) return false;
    this.taken++;
    this.next = this.since + (this.taken + 1) * this.sampling.sampleEvery;
    const t = model.time;
    const q = this.sampled(model);
    const z = this.monitor.sample(q, t);
    this.viewMean.add(t, z);
    this.frames.add(t, model.steps, z);
    this.lastSample = t;
    this.window = this.viewMean.mean(this.mean);
    this.meanJets = this.monitor.jetFinder.find(this.mean.ubar);
    this.latestJets = this.monitor.jetFinder.find(z.ubar);
    this.staircase = this.monitor.staircase ? this.monitor.staircase.fit(this.mean.qtot) : null;
    if (wants.spectra) this.spectral.addSpectra(q, t, wants.spectra2d);
    if (wants.flux) this.spectral.addFlux(q, t);
    return true;
  }

  /** A new averaging window for the views; the time means start again from the next sample. */
  setMeanSpan(span: number): void {
    this.sampling.meanSpan = span;
    this.viewMean = this.newMean(span);
    this.window = null;
    this.meanJets = null;
    this.staircase = null;
  }

  setSpectralAverage(n: number): void {
    this.sampling.spectralAverage = n;
    this.spectral.setAverage(n);
  }

  status(epoch: number): MonitorStatus {
    return {
      epoch,
      since: this.since,
      ...this.sampling,
      samples: this.taken,
      lastSample: this.lastSample,
      window: this.window ? { ...this.window } : null,
      jetCount: this.meanJets ? this.meanJets.count : null,
      staircaseIndex: this.staircase ? this.staircase.index : null,
    };
  }

  /** The run summary (summary.ts) over the monitor's window, at the model's time. */
  summary(model: Model): RunSummary {
    return summarize(this.monitor, model.time, model.steps);
  }
}
