import { rhinesWavenumber, regimeOf, transitionalWavenumber, type Regime } from './scales';
import type { RunMonitor } from './runMonitor';

/**
 * The run summary: the numbers a run is quoted by, under stable keys that the app, the command line
 * and files share (model units). Definitions:
 * - time, steps: at the last step recorded.
 * - energy ½⟨|∇ψ|² + k_d²ψ²⟩, enstrophy ½⟨q²⟩, u_rms = ⟨u² + v²⟩^½ = (2·KE)^½, injection ε,
 *   drag_loss 2μ·KE, hyper_loss (hyperviscous), ls_loss (large-scale drag): time means over the
 *   averaging window (`window_start` to `window_end`), from every step's budget.
 * - k_rhines = (β/2U)^½ with U = u_rms (Rhines 1975), k_beta = (β³/ε)^{1/5} with the measured mean
 *   injection (Vallis & Maltrud 1993), zonostrophy_index = k_beta/k_rhines and its regime
 *   (Sukoriansky et al. 2007; Galperin et al. 2010).
 * - jet_count, jet_spacing (mean distance between eastward jets, Ly/count), jet_spacing_std: from the
 *   time-mean ū(y) over the window (`jets.ts`, each jet standing out by at least a quarter of
 *   u_rms, `RunMonitor.structure`); staircase_index from the time-mean total PV
 *   (`staircase.ts`, docs/staircase.md).
 * Undefined values (β = 0, no jets, no samples yet) are null, so the object is valid JSON.
 */
export interface RunSummary {
  time: number;
  steps: number;
  energy: number | null;
  enstrophy: number | null;
  u_rms: number | null;
  k_rhines: number | null;
  k_beta: number | null;
  zonostrophy_index: number | null;
  jet_count: number | null;
  jet_spacing: number | null;
  staircase_index: number | null;
  injection: number | null;
  drag_loss: number | null;
  hyper_loss: number | null;
  ls_loss: number | null;
  regime: Regime | null;
  jet_spacing_std: number | null;
  window_start: number | null;
  window_end: number | null;
  window_samples: number;
}

/** The stable keys, in order (the JSON of `stria run --json`, columns of sweep tables). */
export const SUMMARY_KEYS = [
  'time',
  'steps',
  'energy',
  'enstrophy',
  'u_rms',
  'k_rhines',
  'k_beta',
  'zonostrophy_index',
  'jet_count',
  'jet_spacing',
  'staircase_index',
  'injection',
  'drag_loss',
  'hyper_loss',
] as const satisfies readonly (keyof RunSummary)[];

const finite = (x: number): number | null => (Number.isFinite(x) ? x : null);

/**
 * Budget means over [t0, t1]; a window too short to hold a budget sample (a single zonal sample)
 * falls back to the last budget sample, the nearest thing to an instantaneous value.
 */
function budgetOver(monitor: RunMonitor, t0: number, t1: number) {
  const series = monitor.budget;
  if (series.length === 0) return null;
  const m = series.timeMean(t0, t1);
  if (m.samples > 0) return m;
  const times = series.columns().time;
  return series.timeMean(times[times.length - 1], Infinity);
}

/** The summary of a monitored run up to time `time` after `steps` steps. */
export function summarize(monitor: RunMonitor, time: number, steps: number): RunSummary {
  const p = monitor.params;
  const win = monitor.sampleCount > 0 ? monitor.meanProfiles() : null;
  const budget = budgetOver(monitor, win ? win.tStart : -Infinity, win ? win.tEnd : Infinity);
  const ke = budget?.kinetic.mean ?? NaN;
  const U = Math.sqrt(2 * ke);
  const eps = budget?.energy.injection.mean ?? NaN;
  const kR = p.beta > 0 && U > 0 ? rhinesWavenumber(p.beta, U) : NaN;
  const kB = p.beta > 0 && eps > 0 ? transitionalWavenumber(p.beta, eps) : NaN;
  const R = kB / kR;
  const structure = win && win.count > 0 ? monitor.structure(Number.isFinite(U) ? U : 0) : null;
  const jets = structure?.jets;
  return {
    time,
    steps,
    energy: finite(budget?.energy.value.mean ?? NaN),
    enstrophy: finite(budget?.enstrophy.value.mean ?? NaN),
    u_rms: finite(U),
    k_rhines: finite(kR),
    k_beta: finite(kB),
    zonostrophy_index: finite(R),
    jet_count: jets ? jets.count : null,
    jet_spacing: jets?.meanSpacing ?? null,
    staircase_index: structure?.staircase ? finite(structure.staircase.index) : null,
    injection: finite(eps),
    drag_loss: finite(budget?.energy.drag.mean ?? NaN),
    hyper_loss: finite(budget?.energy.hyper.mean ?? NaN),
    ls_loss: finite(budget?.energy.largeScale.mean ?? NaN),
    regime: Number.isFinite(R) ? regimeOf(R) : null,
    jet_spacing_std: jets?.spacingStd ?? null,
    window_start: win ? win.tStart : null,
    window_end: win ? win.tEnd : null,
    window_samples: win ? win.count : 0,
  };
}
