import type { JetVerdict } from '../lib/analysis/jetDetector';
import type { RunSummary } from '../lib/analysis/summary';
import type { WindowReport } from '../lib/analysis/timeMean';
import type { LayerPayload } from './layerPayload';
import type { LayerSpectraPayload } from './layerSpectralDiagnostics';

/**
 * The diagnostics part of the snapshot protocol (simulationApi.ts). The worker runs a RunMonitor on
 * every run: it records every step's budget and samples the zonal means at equal model-time
 * intervals (`sampleEvery`), keeping their time means over a window and the Hovmöller record of
 * ū(y, t). That much always runs, so the jet count and the Hovmöller history exist whatever is shown.
 *
 * The rest is computed only for the views on screen (`setDiagnostics`): the payloads below ride in
 * the coalesced snapshots as transferred typed arrays, each at most a few times per second while
 * playing, and only when it has something new. A snapshot without a payload means "unchanged".
 * Every diagnostic restarts (a new `epoch`) with a new run and with any change of the parameters or
 * of the sample interval: time means across such a change would mix two runs.
 */
export interface DiagnosticNeeds {
  /** Zonal-mean profiles, their time means, jets and staircase (the Zonal view). */
  zonal: boolean;
  /** The Hovmöller record with its jet tracks. */
  hovmoller: boolean;
  /** Isotropic, zonal and residual energy spectra (averaged over recent samples). */
  spectra: boolean;
  /** The 2D spectrum E(kx, ky) as well (only with `spectra`). */
  spectra2d: boolean;
  /** Spectral fluxes Π_E, Π_Z and the eddy-to-mean conversion. */
  flux: boolean;
  /** Two layers: the layers' zonal means, the heat flux and the energy cycle (layerPayload.ts); nothing in one layer. Absent: not needed. */
  layers?: boolean;
  /** Two layers: barotropic and baroclinic spectra, their fluxes and the exchange between the modes (layerSpectralDiagnostics.ts); nothing in one layer. Absent: not needed. */
  layerSpectra?: boolean;
}

export const NO_NEEDS: Readonly<DiagnosticNeeds> = Object.freeze({
  zonal: false,
  hovmoller: false,
  spectra: false,
  spectra2d: false,
  flux: false,
  layers: false,
  layerSpectra: false,
});

/** How the worker samples and averages; a field left out keeps its current value, null restores the default. */
export interface SamplingOptions {
  /** Model time between samples (> 0); default `defaultSampleEvery(params)`. Restarts the diagnostics. */
  sampleEvery?: number | null;
  /** The time means average the samples of the last `meanSpan` time units; default 1/μ (50 when μ = 0). */
  meanSpan?: number | null;
  /** Spectra and fluxes are averaged over this many recent samples (1–256; default 16). */
  spectralAverage?: number | null;
}

/** The settings in force, and what the monitor has gathered; in every snapshot (a few numbers). */
export interface MonitorStatus {
  epoch: number;
  /** Model time at which the diagnostics (re)started. */
  since: number;
  sampleEvery: number;
  meanSpan: number;
  spectralAverage: number;
  samples: number;
  /** Time of the latest sample, null before the first. */
  lastSample: number | null;
  /** The window the time means cover now (null before the first sample). */
  window: WindowReport | null;
  /**
   * Significant eastward jets of the time-mean ū over the window (jetDetector.ts), null before the
   * first sample and while the window is too short to tell (= summary.jet_count).
   */
  jetCount: number | null;
  /** Why the detector decided as it did (jetDetector.ts `reason`), null before the first sample. */
  jetReason: string | null;
  /** Sharpness index of the staircase of the time-mean q̄ + βy (null when β = 0 or no sample yet). */
  staircaseIndex: number | null;
  /** The run summary over the same window (summary.ts): the numbers every view and file quotes. */
  summary: RunSummary;
}

/** One jet of a profile, as drawn: position, peak speed, half-level edges (model units). */
export interface JetMark {
  y: number;
  speed: number;
  ySouth: number;
  yNorth: number;
  /** Eddy forcing of the core: the mean of −∂y(u′v′) over [ySouth, yNorth] (jets.ts coreConvergence); > 0 when eddies feed the jet. */
  coreForcing: number;
}

/** The PV staircase of the time-mean q̄ + βy (jetDetector.ts), for drawing. */
export interface StaircaseMark {
  edges: number[];
  levels: number[];
  widths: number[];
  index: number;
  indexStderr: number | null;
  rho: number;
}

/** Zonal-mean profiles on y_j = j·Ly/ny (model units): the latest sample and the time means. */
export interface ZonalPayload {
  y: Float64Array;
  Ly: number;
  beta: number;
  /** Time of the sample the instantaneous profiles are from. */
  time: number;
  ubar: Float64Array;
  qtot: Float64Array;
  convUpvp: Float64Array;
  meanUbar: Float64Array;
  meanQtot: Float64Array;
  meanConvUpvp: Float64Array;
  window: WindowReport;
  /** Significant jets of the time mean (and the verdict and its reason), and of the instantaneous profile. */
  jets: JetMark[];
  jetVerdict: JetVerdict;
  jetReason: string;
  jetsNow: JetMark[];
  meanJetSpacing: number | null;
  meanJetSpacingStderr: number | null;
  staircase: StaircaseMark | null;
}

/** A jet followed through the Hovmöller record (jetTracking.ts); y unwrapped across the seam. */
export interface TrackMark {
  t: Float64Array;
  y: Float64Array;
}

/** The Hovmöller record of ū(y, t): column-major, column c at data[c·ny .. (c+1)·ny). */
export interface HovmollerPayload {
  ny: number;
  Ly: number;
  columns: number;
  samplesPerColumn: number;
  t: Float64Array;
  data: Float64Array;
  tracks: TrackMark[];
  mergers: { t: number; y: number }[];
  splits: { t: number; y: number }[];
}

/** Shell spectra (sums per shell of width dk, spectra.ts), averaged over `count` recent samples. */
export interface SpectraPayload {
  k: Float64Array;
  E: Float64Array;
  EZonal: Float64Array;
  EResidual: Float64Array;
  dk: number;
  /** Shells below this hold only kept modes (the isotropic range); fits belong there. */
  completeShells: number;
  count: number;
  /** Sample times averaged: first and last. */
  tStart: number;
  tEnd: number;
  /**
   * The 2D energy spectrum (rows ky2d ascending, columns kx2d), or null: too large to keep a ring of,
   * it is the mean of consecutive blocks of `spectralAverage` samples, `count2d` of them in this one.
   */
  count2d: number;
  kx2d: Float64Array | null;
  ky2d: Float64Array | null;
  E2d: Float64Array | null;
}

/** Spectral fluxes through the shell edges (spectralFlux.ts), averaged over `count` recent samples. */
export interface FluxPayload {
  kEdge: Float64Array;
  PiE: Float64Array;
  PiZ: Float64Array;
  count: number;
  tStart: number;
  tEnd: number;
  /** Eddy-to-mean energy conversion C = Σ_{kx=0} T_E at each flux sample (bounded series). */
  conversionT: Float64Array;
  conversion: Float64Array;
}

export interface DiagnosticsPayload {
  status: MonitorStatus;
  zonal: ZonalPayload | null;
  hovmoller: HovmollerPayload | null;
  spectra: SpectraPayload | null;
  flux: FluxPayload | null;
  /** Two-layer runs only, when asked for (`layers`). */
  layers: LayerPayload | null;
  /** Two-layer runs only, when asked for (`layerSpectra`). */
  layerSpectra: LayerSpectraPayload | null;
}
