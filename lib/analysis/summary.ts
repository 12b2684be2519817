import type { JetVerdict } from './jetDetector';
import { scalarStandardError } from './noiseReference';
import type { RunMonitor, Structure } from './runMonitor';
import { rhinesWavenumber, regimeOf, transitionalWavenumber, type Regime } from './scales';

/**
 * The run summary: the numbers a run is quoted by, under stable keys that the app, the command line
 * and files share (model units). Definitions:
 * - time, steps: at the last step recorded.
 * - energy ½⟨|∇ψ|² + k_d²ψ²⟩, enstrophy ½⟨q²⟩, u_rms = ⟨u² + v²⟩^½ = (2·KE)^½, injection ε,
 *   drag_loss 2μ·KE, hyper_loss (hyperviscous), ls_loss (large-scale drag): time means over the
 *   averaging window (`window_start` to `window_end`), from every step's budget, all at the same
 *   instants (the start of each step).
 * - k_rhines = (β/2U)^½ with U = u_rms (Rhines 1975), k_beta = (β³/ε)^{1/5} with the measured mean
 *   injection (Vallis & Maltrud 1993), zonostrophy_index = k_beta/k_rhines.
 * - steady: whether the statistical steady state has been reached (steadyCriterion.ts), and since
 *   when; regime: from the time-mean zonostrophy index once steady (Sukoriansky et al. 2007;
 *   Galperin et al. 2010), 'spinning-up' before.
 * - jet_verdict, jet_count, jet_spacing (mean distance between eastward jets), jet_spacing_std,
 *   staircase_index: from the time-mean ū(y) and total PV over the window, by the one detector with
 *   its significance test (jetDetector.ts, docs/significance.md). jet_count is null when the window
 *   is too short to tell.
 * - *_stderr: standard errors of the window's time means (docs/significance.md): u_rms from the
 *   kinetic-energy series, zonostrophy_index from those of u_rms and ε, jet_spacing and
 *   staircase_index from the detector.
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
  u_rms_stderr: number | null;
  zonostrophy_index_stderr: number | null;
  jet_spacing_stderr: number | null;
  staircase_index_stderr: number | null;
  jet_verdict: JetVerdict | null;
  steady: boolean;
  regime: Regime | 'spinning-up' | null;
  steady_since: number | null;
  jet_spacing_std: number | null;
  effective_samples: number | null;
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
  'u_rms_stderr',
  'zonostrophy_index_stderr',
  'jet_spacing_stderr',
  'staircase_index_stderr',
  'jet_verdict',
  'steady',
  'regime',
] as const satisfies readonly (keyof RunSummary)[];

/** The summary's other keys, in order (after the stable ones in tables). */
export const SUMMARY_OTHER_KEYS = [
  'ls_loss',
  'steady_since',
  'jet_spacing_std',
  'effective_samples',
  'window_start',
  'window_end',
  'window_samples',
] as const satisfies readonly (keyof RunSummary)[];

/** What each key holds, for readers of summaries written elsewhere (sweep journals, tables). */
export const SUMMARY_TEXT_VALUES = {
  jet_verdict: ['jets', 'no-jets', 'too-short'],
  regime: ['friction-dominated', 'transitional', 'zonostrophic', 'spinning-up'],
} as const satisfies Partial<Record<keyof RunSummary, readonly string[]>>;
export const SUMMARY_BOOLEAN_KEYS = ['steady'] as const satisfies readonly (keyof RunSummary)[];
/** Keys that are always numbers (never null). */
export const SUMMARY_COUNT_KEYS = ['time', 'steps', 'window_samples'] as const satisfies readonly (keyof RunSummary)[];

const finite = (x: number): number | null => (Number.isFinite(x) ? x : null);

/**
 * Budget means over [t0, t1] with the standard errors of u_rms and ε; a window too short to hold a
 * budget sample (a single zonal sample) falls back to the last budget sample.
 */
function budgetOver(monitor: RunMonitor, t0: number, t1: number) {
  const series = monitor.budget;
  if (series.length === 0) return null;
  let m = series.timeMean(t0, t1);
  if (m.samples === 0) {
    const times = series.columns().time;
    m = series.timeMean(times[times.length - 1], Infinity);
  }
  const cols = series.columns();
  const inWindow = (c: Float64Array) => c.filter((_, i) => cols.time[i] >= m.from && cols.time[i] <= m.to);
  const ke = inWindow(cols.kinetic);
  const eps = inWindow(cols.energy.injection);
  const interval = ke.length ? m.duration / ke.length : 0;
  // Energy perturbations relax at 2μ under linear drag (dE/dt = ε − 2μE + …): memory 1/(2μ) [derived].
  const memory = monitor.params.mu > 0 ? 1 / (2 * monitor.params.mu) : 0;
  const keError = interval > 0 ? scalarStandardError(ke, interval, m.duration, memory) : null;
  const epsError = interval > 0 ? scalarStandardError(eps, interval, m.duration, memory) : null;
  return { m, keError: keError?.stderr ?? NaN, epsError: epsError?.stderr ?? NaN };
}

/**
 * The summary of a monitored run up to time `time` after `steps` steps; `structure`, the monitor's
 * own, when the caller has already worked it out.
 */
export function summarize(
  monitor: RunMonitor,
  time: number,
  steps: number,
  structure: Structure | null = monitor.sampleCount > 0 ? monitor.structure() : null,
): RunSummary {
  const p = monitor.params;
  const win = monitor.sampleCount > 0 ? monitor.means.window : null;
  const b = budgetOver(monitor, win ? win.tStart : -Infinity, win ? win.tEnd : Infinity);
  const ke = b?.m.kinetic.mean ?? NaN;
  const U = Math.sqrt(2 * ke);
  // U = (2 KE)^½: δU = δKE/U.
  const Uerr = (b?.keError ?? NaN) / U;
  const eps = b?.m.energy.injection.mean ?? NaN;
  const kR = p.beta > 0 && U > 0 ? rhinesWavenumber(p.beta, U) : NaN;
  const kB = p.beta > 0 && eps > 0 ? transitionalWavenumber(p.beta, eps) : NaN;
  const R = kB / kR;
  // R_β ∝ ε^{−1/5} U^{½}: relative errors add in quadrature with weights 1/5 and ½ (independent errors).
  const epsErr = b?.epsError ?? NaN;
  const Rerr = R * Math.hypot((epsErr > 0 ? epsErr : 0) / (5 * eps), Uerr / (2 * U));
  const jets = structure?.jets ?? null;
  const stairs = structure?.staircase ?? null;
  const steady = monitor.steady.steadyAt !== null;
  return {
    time,
    steps,
    energy: finite(b?.m.energy.value.mean ?? NaN),
    enstrophy: finite(b?.m.enstrophy.value.mean ?? NaN),
    u_rms: finite(U),
    k_rhines: finite(kR),
    k_beta: finite(kB),
    zonostrophy_index: finite(R),
    jet_count: jets ? jets.count : null,
    jet_spacing: jets?.meanSpacing ?? null,
    staircase_index: stairs && stairs.index !== null ? finite(stairs.index) : null,
    injection: finite(eps),
    drag_loss: finite(b?.m.energy.drag.mean ?? NaN),
    hyper_loss: finite(b?.m.energy.hyper.mean ?? NaN),
    ls_loss: finite(b?.m.energy.largeScale.mean ?? NaN),
    u_rms_stderr: finite(Uerr),
    zonostrophy_index_stderr: finite(Rerr),
    jet_spacing_stderr: jets?.spacingStderr ?? null,
    staircase_index_stderr: stairs?.indexStderr ?? null,
    jet_verdict: jets ? jets.verdict : null,
    steady,
    regime: !steady ? 'spinning-up' : Number.isFinite(R) ? regimeOf(R) : null,
    steady_since: monitor.steady.steadyAt,
    jet_spacing_std: jets?.spacingStd ?? null,
    effective_samples: jets?.effectiveSamples ?? null,
    window_start: win ? win.tStart : null,
    window_end: win ? win.tEnd : null,
    window_samples: win ? win.count : 0,
  };
}
