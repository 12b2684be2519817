import type { JetVerdict } from './jetDetector';
import { scalarStandardError } from './noiseReference';
import { flowMemory, type RunMonitor, type Structure } from './runMonitor';
import { twoLayerCoefficients } from '../model/params';
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
 * Two layers (docs/two-layer.md): the keys above are of the barotropic flow ψ_bt = h₁ψ₁ + h₂ψ₂ (h_i =
 * H_i/H) where they are of a flow: u_rms is the rms of all eddy velocities, (2·KE)^½ with KE = KE₁ + KE₂
 * depth-weighted, as in the budget; k_rhines from it; jet_* and staircase_* of the barotropic ū and
 * PV (gradient β), with the flow memory 1/(μh₂) (runMonitor.ts flowMemory); energy, enstrophy and the
 * losses those of the two-layer budget. The keys appended for two layers:
 * - layers: 1 or 2 (always a number).
 * - supercriticality: ξ = F₂(U₁ − U₂)/β = δk_d²(U₁ − U₂)/((1 + δ)β), the shear over the critical shear
 *   of the Phillips model, where the lower layer's mean PV gradient changes sign (lib/plan/linearStability.ts
 *   criticalShear); for equal layers k_d²(U₁ − U₂)/(2β) = U/(βλ²), Held & Larichev's criticality with
 *   U = (U₁ − U₂)/2 and λ = 1/k_d (J. Atmos. Sci. 53, 946, 1996). A parameter, not a time mean; null
 *   when β = 0.
 * - heat_flux: ⟨vτ⟩, τ = ψ₁ − ψ₂, the domain-mean eddy interface (heat) flux (length³/time²), time mean.
 * - eddy_diffusivity: D = ⟨vτ⟩/(U₁ − U₂), the bulk eddy diffusivity of the interface (heat), whose
 *   mean gradient is ∂y τ̄_imposed = −(U₁ − U₂) (length²/time): the D of Held & Larichev's D/(Uλ) ≈ ξ².
 *   Null when the shear is 0.
 * - eddy_velocity: V = (2⟨KE_bt⟩)^½ = ⟨|∇ψ_bt|²⟩^½, the rms barotropic velocity of the flow (jets
 *   included; the imposed flow has no barotropic part), time mean of KE_bt first.
 * - energy_generation: F₁h₁(U₁ − U₂)⟨vτ⟩, the rate the imposed shear feeds the eddies, time mean.
 * - *_stderr of these four: standard errors of the window's time means (noiseReference.ts
 *   scalarStandardError) with N_eff bounded by the energy's memory 1/(2μh₂), as u_rms's in one layer.
 * One-layer runs: layers = 1 and null for the others.
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
  layers: number;
  supercriticality: number | null;
  heat_flux: number | null;
  eddy_diffusivity: number | null;
  eddy_velocity: number | null;
  energy_generation: number | null;
  heat_flux_stderr: number | null;
  eddy_diffusivity_stderr: number | null;
  eddy_velocity_stderr: number | null;
  energy_generation_stderr: number | null;
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
  'layers',
  'supercriticality',
  'heat_flux',
  'eddy_diffusivity',
  'eddy_velocity',
  'energy_generation',
  'heat_flux_stderr',
  'eddy_diffusivity_stderr',
  'eddy_velocity_stderr',
  'energy_generation_stderr',
] as const satisfies readonly (keyof RunSummary)[];

/**
 * Keys appended with the two-layer diagnostics: journals and tables written before them lack them,
 * and readers take a missing one as null (lib/sweep/sweepRecord.ts).
 */
export const SUMMARY_TWO_LAYER_KEYS = [
  'layers',
  'supercriticality',
  'heat_flux',
  'eddy_diffusivity',
  'eddy_velocity',
  'energy_generation',
  'heat_flux_stderr',
  'eddy_diffusivity_stderr',
  'eddy_velocity_stderr',
  'energy_generation_stderr',
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
export const SUMMARY_COUNT_KEYS = [
  'time',
  'steps',
  'window_samples',
  'layers',
] as const satisfies readonly (keyof RunSummary)[];

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
  // Energy perturbations relax at 2μ under linear drag (dE/dt = ε − 2μE + …): memory 1/(2μ) [derived];
  // half the flow memory in two layers too (the barotropic energy relaxes at 2μh₂).
  const memory = flowMemory(monitor.params) / 2;
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
    ...twoLayerSummary(monitor, win ? win.tStart : -Infinity, win ? win.tEnd : Infinity),
  };
}

type TwoLayerKeys = (typeof SUMMARY_TWO_LAYER_KEYS)[number];

/** The two-layer keys (see RunSummary): time means of the energy cycle series over [t0, t1]. */
function twoLayerSummary(monitor: RunMonitor, t0: number, t1: number): Pick<RunSummary, TwoLayerKeys> {
  const p = monitor.params;
  const none = {
    layers: p.layers,
    supercriticality: null,
    heat_flux: null,
    eddy_diffusivity: null,
    eddy_velocity: null,
    energy_generation: null,
    heat_flux_stderr: null,
    eddy_diffusivity_stderr: null,
    eddy_velocity_stderr: null,
    energy_generation_stderr: null,
  };
  const layers = monitor.layers;
  if (!layers) return none;
  const c = twoLayerCoefficients(p);
  const xi = p.beta > 0 ? (c.F2 * p.shear) / p.beta : NaN;
  const series = layers.cycle;
  if (series.length === 0) return { ...none, supercriticality: finite(xi) };
  let m = series.timeMean(t0, t1);
  if (m.samples === 0) {
    const times = series.columns().time;
    m = series.timeMean(times[times.length - 1], Infinity);
  }
  const cols = series.columns();
  const inWindow = (x: Float64Array) => x.filter((_, i) => cols.time[i] >= m.from && cols.time[i] <= m.to);
  const heat = inWindow(cols.terms.heatFlux);
  const keBt = inWindow(cols.terms.kineticBarotropic);
  const interval = heat.length ? m.duration / heat.length : 0;
  const memory = flowMemory(p) / 2;
  const err = (x: Float64Array) =>
    interval > 0 ? (scalarStandardError(x, interval, m.duration, memory)?.stderr ?? NaN) : NaN;
  const heatErr = err(heat);
  const V = Math.sqrt(2 * m.mean.kineticBarotropic);
  const shear = p.shear;
  const F1h1 = c.F1 * c.h1;
  return {
    layers: p.layers,
    supercriticality: finite(xi),
    heat_flux: finite(m.mean.heatFlux),
    eddy_diffusivity: shear !== 0 ? finite(m.mean.heatFlux / shear) : null,
    eddy_velocity: finite(V),
    energy_generation: finite(m.mean.generation),
    heat_flux_stderr: finite(heatErr),
    eddy_diffusivity_stderr: shear !== 0 ? finite(heatErr / Math.abs(shear)) : null,
    // V = (2 KE_bt)^½: δV = δKE_bt/V.
    eddy_velocity_stderr: finite(err(keBt) / V),
    energy_generation_stderr: finite(F1h1 * Math.abs(shear) * heatErr),
  };
}
