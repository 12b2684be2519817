import { CYCLE_TERMS, type CycleTerm } from '../lib/analysis/cycleSeries';
import type { LayerMonitor } from '../lib/analysis/layerMonitor';
import type { WindowReport } from '../lib/analysis/timeMean';

/**
 * What the views of a two-layer run receive (diagnosticsApi.ts `DiagnosticNeeds.layers`), from the
 * worker's LayerMonitor (lib/analysis/layerMonitor.ts). Model units; y_j = j·Ly/ny; suffix 1 the upper
 * layer, 2 the lower; h_i = H_i/H.
 *
 * Zonal means of each layer (ū_i and the total PV q̄_i + Q_i y) and the eddy heat (interface) flux
 * (v′τ′)‾, τ = ψ₁ − ψ₂: the latest sample and the time means over the views' window.
 *
 * The energy cycle (docs/two-layer.md, "The energy cycle"; lib/analysis/cycleSeries.ts): the
 * dt-weighted means of every term over the recent stretch `recent` (the last RECENT_SAMPLES sample
 * intervals: what the cycle does now) and over the views' window (`window`), and a thinned series of
 * the main terms for the chart and the CSV.
 */
export interface CycleMean {
  from: number;
  to: number;
  terms: Record<CycleTerm, number>;
}

export interface LayerPayload {
  y: Float64Array;
  Ly: number;
  h1: number;
  h2: number;
  /** The layers' mean PV gradients Q₁ = β + F₁(U₁ − U₂), Q₂ = β − F₂(U₁ − U₂). */
  Q1: number;
  Q2: number;
  shear: number;
  time: number;
  ubar1: Float64Array;
  ubar2: Float64Array;
  qtot1: Float64Array;
  qtot2: Float64Array;
  heat: Float64Array;
  meanUbar1: Float64Array;
  meanUbar2: Float64Array;
  meanQtot1: Float64Array;
  meanQtot2: Float64Array;
  meanHeat: Float64Array;
  window: WindowReport | null;
  recent: CycleMean | null;
  windowCycle: CycleMean | null;
  /** Series of every cycle term, at most SERIES_POINTS samples (the latest ones, thinned evenly). */
  series: { time: Float64Array; terms: Record<CycleTerm, Float64Array> };
}

/** The recent stretch of the cycle: this many sample intervals. */
export const RECENT_SAMPLES = 8;
/** Most points of the series sent (it is drawn and exported, not analysed). */
export const SERIES_POINTS = 400;

export function layerPayload(
  layers: LayerMonitor,
  Ly: number,
  time: number,
  sampleEvery: number,
): { payload: LayerPayload; buffers: ArrayBuffer[] } {
  const z = layers.latest;
  const c = layers.coefficients;
  const window = layers.means.window.count > 0 ? { ...layers.meanProfiles() } : null;
  const m = layers.mean;
  const ny = z.upper.ubar.length;
  const y = Float64Array.from({ length: ny }, (_, j) => (j * Ly) / ny);
  const copy = (a: Float64Array) => a.slice();
  const cycle = layers.cycle;
  const now = cycleMean(layers, time - RECENT_SAMPLES * sampleEvery, Infinity);
  const whole = window ? cycleMean(layers, window.tStart, window.tEnd) : null;
  const cols = cycle.columns();
  const n = cols.time.length;
  const stride = Math.max(1, Math.ceil(n / SERIES_POINTS));
  const count = Math.ceil(n / stride);
  const pick = (a: Float64Array) => Float64Array.from({ length: count }, (_, i) => a[n - 1 - (count - 1 - i) * stride]);
  const terms = {} as Record<CycleTerm, Float64Array>;
  for (const t of CYCLE_TERMS) terms[t] = pick(cols.terms[t]);
  const payload: LayerPayload = {
    y,
    Ly,
    h1: c.h1,
    h2: c.h2,
    Q1: c.Q1,
    Q2: c.Q2,
    shear: layers.params.shear,
    time,
    ubar1: copy(z.upper.ubar),
    ubar2: copy(z.lower.ubar),
    qtot1: copy(z.upper.qtot),
    qtot2: copy(z.lower.qtot),
    heat: copy(z.heatFlux),
    meanUbar1: copy(m.ubar1),
    meanUbar2: copy(m.ubar2),
    meanQtot1: copy(m.qtot1),
    meanQtot2: copy(m.qtot2),
    meanHeat: copy(m.heat),
    window,
    recent: now,
    windowCycle: whole,
    series: { time: pick(cols.time), terms },
  };
  const buffers = [
    payload.y,
    payload.ubar1,
    payload.ubar2,
    payload.qtot1,
    payload.qtot2,
    payload.heat,
    payload.meanUbar1,
    payload.meanUbar2,
    payload.meanQtot1,
    payload.meanQtot2,
    payload.meanHeat,
    payload.series.time,
    ...Object.values(terms),
  ].map((a) => a.buffer as ArrayBuffer);
  return { payload, buffers };
}

function cycleMean(layers: LayerMonitor, t0: number, t1: number): CycleMean | null {
  const w = layers.cycle.timeMean(t0, t1);
  return w.samples > 0 && w.duration > 0 ? { from: w.from, to: w.to, terms: w.mean } : null;
}
