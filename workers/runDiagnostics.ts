import type { JetReport } from '../lib/analysis/jets';
import { successiveSpread } from '../lib/analysis/noiseReference';
import { flowMemory, RunMonitor, type MeanProfile, type Structure } from '../lib/analysis/runMonitor';
import { summarize, type RunSummary } from '../lib/analysis/summary';
import type { TimeWindow, WindowReport } from '../lib/analysis/timeMean';
import { layerZonalMeanFrame } from '../lib/io/cfStriaWriter';
import { reachedTime } from '../lib/model/clock';
import type { Model } from '../lib/model/model';
import type { ModelParams } from '../lib/model/params';
import { monitoredState } from '../lib/run/monitoredRun';
import type { MonitorStatus } from './diagnosticsApi';
import { LayerSpectralDiagnostics } from './layerSpectralDiagnostics';
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

/**
 * Default averaging window: the flow's memory, as the RunMonitor's (flowMemory: 1/μ in one layer,
 * 1/(μh₂) in two, where the drag acts on the lower layer only), or 50 without drag.
 */
export function defaultMeanSpan(p: ModelParams): number {
  return p.mu > 0 ? flowMemory(p) : 50;
}

export const DEFAULT_SPECTRAL_AVERAGE = 16;

/** What the views on screen ask of a sample beyond the zonal means (DiagnosticNeeds). */
type Wants = { spectra: boolean; spectra2d: boolean; flux: boolean; layerSpectra?: boolean };

/**
 * What the worker measures of one run between two restarts: a RunMonitor fed every step and
 * sampled at t₀ + n·sampleEvery (the first step ending at or after each, as the command line does),
 * whose time means over the chosen window serve the views, the readouts and the run summary alike
 * (one window, one detector: the same numbers everywhere), the zonal-mean frames for export, and
 * spectra and fluxes when asked for. The jets, staircase and summary are worked out at most once per
 * sample, when first asked for.
 */
export class RunDiagnostics {
  readonly monitor: RunMonitor;
  readonly frames: ZonalFrameStore;
  readonly spectral: SpectralDiagnostics;
  /** Two layers: the barotropic and baroclinic spectra and fluxes; null in one layer. */
  readonly layerSpectral: LayerSpectralDiagnostics | null;
  readonly since: number;
  private taken = 0;
  private barotropic: Float64Array | undefined;
  /** The next sample is due at since + nextIndex·sampleEvery (index 0 only when sampled at the start). */
  private nextIndex = 1;
  private next: number;
  private worked: { structure: Structure | null; latest: JetReport | null; summary: RunSummary } | null = null;
  private model: { time: number; steps: number } = { time: 0, steps: 0 };
  lastSample: number | null = null;

  constructor(
    public params: ModelParams,
    start: number,
    readonly sampling: Sampling,
  ) {
    this.since = start;
    this.model = { time: start, steps: 0 };
    this.next = start + sampling.sampleEvery;
    // Two layers: the monitor watches the barotropic flow (jets, staircase, Hovmöller) and keeps the
    // layers' own zonal means and energy cycle (RunMonitor.layers); the spectra are of the barotropic PV.
    this.monitor = new RunMonitor(params, { window: meanWindow(sampling.meanSpan), start });
    this.frames = new ZonalFrameStore(params.ny, undefined, params.layers);
    this.spectral = new SpectralDiagnostics(this.monitor.snap, sampling.spectralAverage);
    this.layerSpectral = params.layers === 2 ? new LayerSpectralDiagnostics(params, sampling.spectralAverage) : null;
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

  /** The time-mean profiles of the window (as of the last `current()`). */
  get mean(): Record<MeanProfile, Float64Array> {
    return this.monitor.mean;
  }

  /** The window the time means cover, null before the first sample. */
  get window(): WindowReport | null {
    return this.taken > 0 && this.monitor.means.window.count > 0 ? this.monitor.means.window : null;
  }

  /** Record the step just taken; returns true when it was also a sample time. */
  afterStep(model: Model, wants: Wants): boolean {
    this.monitor.step(model.report);
    this.model = { time: model.time, steps: model.steps };
    if (!reachedTime(model.time, this.next, model.dt)) return false;
    this.nextIndex++;
    this.next = this.since + this.nextIndex * this.sampling.sampleEvery;
    this.take(model, wants);
    return true;
  }

  /**
   * Sample the state as it is, at the start of the diagnostics (a loaded run, a new grid), so that
   * the views and readouts show it at once; the next samples follow at since + k·sampleEvery.
   */
  sampleNow(model: Model, wants: Wants): void {
    if (this.taken > 0 || model.time !== this.since) return;
    this.model = { time: model.time, steps: model.steps };
    this.take(model, wants);
  }

  private take(model: Model, wants: Wants): void {
    this.taken++;
    const t = model.time;
    const q = this.sampled(model);
    const z = this.monitor.sample(model.qHat, t);
    const layers = this.monitor.layers;
    // Two layers: the frames of the layered zonal-mean file (each layer's profiles and the heat flux).
    if (layers) this.frames.addFrame(t, model.steps, () => layerZonalMeanFrame(t, model.steps, layers.latest).fields);
    else this.frames.add(t, model.steps, z);
    this.lastSample = t;
    this.worked = null;
    if (wants.spectra) this.spectral.addSpectra(q, t, wants.spectra2d);
    if (wants.flux) this.spectral.addFlux(q, t);
    if (wants.layerSpectra) this.layerSpectral?.add(model.qHat, t);
  }

  /**
   * New parameters on the same grid and domain (a change mid-run): the record goes on (RunMonitor.retune:
   * budget series, Hovmöller, time means and the zonal-mean frames are kept; the steady-state test
   * starts again); the spectral plans follow a new k_d.
   */
  retune(params: ModelParams, model: Model): void {
    this.params = params;
    const snap = this.monitor.snap;
    this.monitor.retune(params, model.time);
    this.barotropic = undefined;
    if (this.monitor.snap !== snap) this.spectral.retune(this.monitor.snap);
    this.layerSpectral?.retune(params);
    this.model = { time: model.time, steps: model.steps };
    this.worked = null;
  }

  /** The time means start again from the next sample (the rest of the record stays). */
  restartMeans(): void {
    this.monitor.setWindow(meanWindow(this.sampling.meanSpan));
    this.worked = null;
  }

  /**
   * Jets and staircase of the window's time means, the jets of the latest profile and the run
   * summary, by the one detector (jetDetector.ts): worked out once per sample.
   */
  current(): { structure: Structure | null; latest: JetReport | null; summary: RunSummary } {
    if (this.worked) return this.worked;
    const m = this.monitor;
    const structure = this.taken > 0 ? m.structure() : null;
    let latest: JetReport | null = null;
    if (this.taken > 0) {
      // The latest profile against the eddy noise of one sample, as the Hovmöller tracks (jetTracking.ts).
      const h = m.hovmoller.view();
      const spread = successiveSpread(h.data, h.columns, m.params.ny);
      latest = m.detector.finder.describe(m.latest.ubar, spread ? m.detector.jetsOfSample(m.latest.ubar, spread) : []);
    }
    const summary = summarize(m, this.model.time, this.model.steps, structure);
    this.worked = { structure, latest, summary };
    return this.worked;
  }

  /** A new averaging window for the views and the summary; the time means start again from the next sample. */
  setMeanSpan(span: number): void {
    this.sampling.meanSpan = span;
    this.monitor.setWindow(meanWindow(span));
    this.worked = null;
  }

  setSpectralAverage(n: number): void {
    this.sampling.spectralAverage = n;
    this.spectral.setAverage(n);
    this.layerSpectral?.setAverage(n);
  }

  status(epoch: number): MonitorStatus {
    const { summary, structure } = this.current();
    return {
      epoch,
      since: this.since,
      ...this.sampling,
      samples: this.taken,
      lastSample: this.lastSample,
      window: this.window ? { ...this.window } : null,
      jetCount: summary.jet_count,
      jetReason: structure?.jets.reason ?? null,
      staircaseIndex: summary.staircase_index,
      summary,
    };
  }

  /** The run summary (summary.ts) over the window, at the model's time. */
  summary(model: Model): RunSummary {
    this.model = { time: model.time, steps: model.steps };
    this.worked = null;
    return this.current().summary;
  }
}

function meanWindow(span: number): TimeWindow {
  return { kind: 'last', span, cap: 256 };
}
