import type { Model } from '../lib/model/model';
import type { DiagnosticNeeds, DiagnosticsPayload, MonitorStatus, SamplingOptions } from './diagnosticsApi';
import { NO_NEEDS } from './diagnosticsApi';
import { hovmollerPayload } from './hovmollerPayload';
import { layerPayload } from './layerPayload';
import { DEFAULT_SPECTRAL_AVERAGE, defaultMeanSpan, defaultSampleEvery, RunDiagnostics } from './runDiagnostics';
import { zonalPayload } from './zonalPayload';

/** Least time between two payloads of one kind while playing (ms): a few per second is all the eye needs. */
export const PAYLOAD_MS = {
  zonal: 250,
  hovmoller: 500,
  spectra: 400,
  flux: 500,
  layers: 250,
  layerSpectra: 400,
} as const;
type Kind = keyof typeof PAYLOAD_MS;
const KINDS = Object.keys(PAYLOAD_MS) as Kind[];

/** Largest number of samples spectra and fluxes may be averaged over. */
export const MAX_SPECTRAL_AVERAGE = 256;

/**
 * The worker's side of the diagnostics protocol (diagnosticsApi.ts): it owns the RunDiagnostics of
 * the current run, restarts them when asked, remembers which views need what, and decides which
 * payloads a snapshot carries: those needed, changed since they were last sent, and not sent in the
 * last PAYLOAD_MS (unless the run is not playing, when everything pending goes at once).
 */
export class DiagnosticsPublisher {
  private diag: RunDiagnostics | null = null;
  private epoch = 0;
  private needs: DiagnosticNeeds = { ...NO_NEEDS };
  private options: SamplingOptions = {};
  private readonly dirty: Record<Kind, boolean> = {
    zonal: false,
    hovmoller: false,
    spectra: false,
    flux: false,
    layers: false,
    layerSpectra: false,
  };
  private readonly sent: Record<Kind, number> = {
    layers: -Infinity,
    zonal: -Infinity,
    hovmoller: -Infinity,
    spectra: -Infinity,
    flux: -Infinity,
    layerSpectra: -Infinity,
  };

  get current(): RunDiagnostics {
    if (!this.diag) throw new Error('no diagnostics: no run has started');
    return this.diag;
  }

  /**
   * Start afresh for the model as it is (a new run, a new grid, a new sample interval); `sampleNow`
   * samples the state at once (a loaded run or a new grid: something to show before the next sample).
   */
  restart(model: Model, sampleNow = false): void {
    const p = model.params;
    const sampleEvery = this.options.sampleEvery ?? defaultSampleEvery(p);
    const meanSpan = Math.max(this.options.meanSpan ?? defaultMeanSpan(p), sampleEvery);
    const spectralAverage = this.options.spectralAverage ?? DEFAULT_SPECTRAL_AVERAGE;
    this.diag = new RunDiagnostics(p, model.time, { sampleEvery, meanSpan, spectralAverage });
    if (sampleNow) this.diag.sampleNow(model, this.needs);
    this.epoch++;
    for (const k of KINDS) this.dirty[k] = true;
  }

  /**
   * New parameters on the same grid and domain: the diagnostics go on with their history
   * (RunDiagnostics.retune) at the sample interval in force, which is kept even when the new step
   * would give another default. Only a step longer than the interval, which could not keep it,
   * restarts them. Returns whether the history was kept.
   */
  retune(model: Model): boolean {
    const d = this.diag;
    if (!d || model.params.dt > d.sampling.sampleEvery) {
      this.restart(model, true);
      return false;
    }
    if (this.options.sampleEvery == null) this.options = { ...this.options, sampleEvery: d.sampling.sampleEvery };
    if (this.options.meanSpan == null) this.options = { ...this.options, meanSpan: d.sampling.meanSpan };
    d.retune(model.params, model);
    for (const k of KINDS) this.dirty[k] = true;
    return true;
  }

  /** The time means start again from the next sample; the rest of the record stays. */
  restartMeans(): void {
    this.current.restartMeans();
    for (const k of KINDS) this.dirty[k] = true;
  }

  status(): MonitorStatus {
    return this.current.status(this.epoch);
  }

  afterStep(model: Model): void {
    if (this.diag?.afterStep(model, this.needs)) for (const k of KINDS) this.dirty[k] = true;
  }

  /** Which views are shown; what they need now and has no sample yet is computed from the state at once. */
  setNeeds(needs: DiagnosticNeeds, model: Model | null): void {
    this.needs = { ...needs };
    const d = this.diag;
    if (d && model) {
      if (needs.spectra && d.spectral.spectraCount === 0)
        d.spectral.addSpectra(d.sampled(model), model.time, needs.spectra2d);
      if (needs.flux && d.spectral.fluxCount === 0) d.spectral.addFlux(d.sampled(model), model.time);
      if (needs.layerSpectra && d.layerSpectral?.count === 0) d.layerSpectral.add(model.qHat, model.time);
    }
    // The two-layer spectra's plan is large (layerSpectralDiagnostics.ts): kept only while a view asks.
    if (d && !needs.layerSpectra) d.layerSpectral?.release();
    for (const k of KINDS) this.dirty[k] = true;
  }

  /** The sampling of the next run: exactly `o`, the rest at the defaults (a new run starts from the defaults unless it brings its own). */
  resetOptions(o: SamplingOptions): void {
    checkOptions(o);
    this.options = { ...o };
  }

  /** Change the sampling; returns true when the diagnostics had to restart (a new sample interval). */
  setSampling(o: SamplingOptions, model: Model | null): boolean {
    checkOptions(o);
    const before = this.diag?.sampling;
    this.options = { ...this.options, ...o };
    for (const k of KINDS) this.dirty[k] = true;
    if (!this.diag || !model) return false;
    const p = model.params;
    if ((this.options.sampleEvery ?? defaultSampleEvery(p)) !== before?.sampleEvery) {
      this.restart(model);
      return true;
    }
    const span = Math.max(this.options.meanSpan ?? defaultMeanSpan(p), before.sampleEvery);
    if (span !== before.meanSpan) this.diag.setMeanSpan(span);
    const avg = this.options.spectralAverage ?? DEFAULT_SPECTRAL_AVERAGE;
    if (avg !== before.spectralAverage) this.diag.setSpectralAverage(avg);
    return false;
  }

  /** The diagnostics part of a snapshot, and the buffers to transfer with it. */
  payload(now: number, playing: boolean): { payload: DiagnosticsPayload; buffers: ArrayBuffer[] } {
    const d = this.current;
    const buffers: ArrayBuffer[] = [];
    const due = (k: Kind, needed: boolean) =>
      needed && this.dirty[k] && (!playing || now - this.sent[k] >= PAYLOAD_MS[k]);
    const take = <T>(k: Kind, built: { payload: T; buffers: ArrayBuffer[] } | null): T | null => {
      this.dirty[k] = false;
      if (!built) return null;
      this.sent[k] = now;
      buffers.push(...built.buffers);
      return built.payload;
    };
    const payload: DiagnosticsPayload = {
      status: this.status(),
      zonal: due('zonal', this.needs.zonal) ? take('zonal', this.zonal(d)) : null,
      hovmoller: due('hovmoller', this.needs.hovmoller)
        ? take('hovmoller', d.samples > 0 ? hovmollerPayload(d.monitor.hovmoller) : null)
        : null,
      spectra: due('spectra', this.needs.spectra)
        ? take('spectra', d.spectral.spectraPayload(this.needs.spectra2d))
        : null,
      flux: due('flux', this.needs.flux) ? take('flux', d.spectral.fluxPayload()) : null,
      layers: due('layers', this.needs.layers === true) ? take('layers', this.layers(d)) : null,
      layerSpectra:
        due('layerSpectra', this.needs.layerSpectra === true) && d.layerSpectral
          ? take('layerSpectra', d.layerSpectral.payload())
          : null,
    };
    return { payload, buffers };
  }

  /** Two layers, once sampled: the layers' zonal means and the energy cycle. */
  private layers(d: RunDiagnostics) {
    const layers = d.monitor.layers;
    if (!layers || d.lastSample === null) return null;
    return layerPayload(layers, d.params.Ly, d.lastSample, d.sampling.sampleEvery);
  }

  private zonal(d: RunDiagnostics) {
    const window = d.window;
    if (!window || d.lastSample === null) return null;
    const { structure, latest } = d.current();
    if (!structure || !latest) return null;
    const { monitor: m } = d;
    // The time means of the window are in m.mean (ū and total PV written by the detector's pass).
    m.meanProfiles();
    return zonalPayload({
      y: m.zonal.y,
      Ly: d.params.Ly,
      beta: d.params.beta,
      time: d.lastSample,
      latest: m.latest,
      mean: d.mean,
      window,
      jets: structure.jets,
      latestJets: latest,
      staircase: structure.staircase,
      finder: m.detector.finder,
    });
  }
}

function checkOptions(o: SamplingOptions): void {
  for (const [key, v] of Object.entries(o) as [keyof SamplingOptions, number | null | undefined][]) {
    if (v === undefined || v === null) continue;
    if (!(typeof v === 'number' && Number.isFinite(v) && v > 0))
      throw new RangeError(`${key} must be a finite number > 0, got ${v}`);
    if (key === 'spectralAverage' && !(Number.isInteger(v) && v <= MAX_SPECTRAL_AVERAGE))
      throw new RangeError(`spectralAverage must be an integer from 1 to ${MAX_SPECTRAL_AVERAGE}, got ${v}`);
  }
}
