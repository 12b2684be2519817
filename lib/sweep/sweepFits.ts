import { fitScaling, type ScalingFitOptions } from '../analysis/scalingFit';
import type { TableRow } from './sweepTable';

/**
 * The scaling laws a sweep checks, fitted across its finished runs (log-log least squares weighted by
 * each run's standard errors, with seeded bootstrap percentile intervals, lib/analysis/scalingFit.ts):
 *   jet spacing against the Rhines length 2π/k_R (measured U): L_jet = A (2π/k_R)^b; b = 1 and an
 *     O(1) prefactor is the Rhines scaling of jets (Rhines 1975), so the prefactor at b = 1 is given too;
 *   u_rms against the drag balance (ε/μ)^½: u_rms = A ((ε/μ)^½)^b; b = 1, A = 1 when drag alone
 *     balances the injection, A < 1 by the share the hyperviscosity takes.
 * and, for two-layer runs (layers = 2), Held & Larichev's scalings against the criticality ξ (the
 * summary's supercriticality; J. Atmos. Sci. 53, 946 (1996) [published], order-one prefactors, and
 * their simulations vary faster with ξ, so the fitted exponents are the measurement):
 *   eddy diffusivity D/(Uλ) against ξ: b = 2 in their scaling, so the prefactor at b = 2 is given;
 *   eddy velocity V/U against ξ: b = 1; with U = (U₁ − U₂)/2 and λ = 1/k_d (sweepTable.ts).
 * A fit that cannot be made (fewer than 3 usable runs, or one distinct x) says why instead; one-layer
 * runs have no ξ and are left out of the last two.
 */
export interface FitReport {
  law: string;
  x: string;
  y: string;
  n: number;
  skipped: number;
  exponent: number | null;
  exponent_ci: [number, number] | null;
  prefactor: number | null;
  prefactor_ci: [number, number] | null;
  prefactor_at_exponent_1: number | null;
  prefactor_at_exponent_1_ci: [number, number] | null;
  /** The exponent the prefactor below is fitted at (1, or 2 for the diffusivity); set by sweepFits. */
  fixed_exponent?: number;
  prefactor_at_fixed_exponent?: number | null;
  prefactor_at_fixed_exponent_ci?: [number, number] | null;
  log_residual_rms: number | null;
  level: number;
  resamples: number;
  degenerate_resamples: number;
  error: string | null;
}

export interface SweepFits {
  jet_spacing_vs_rhines_length: FitReport;
  u_rms_vs_balance_velocity: FitReport;
  eddy_diffusivity_vs_supercriticality: FitReport;
  eddy_velocity_vs_supercriticality: FitReport;
}

export function sweepFits(rows: readonly TableRow[], options: ScalingFitOptions = {}): SweepFits {
  const done = rows.filter((r) => r.status === 'done');
  return {
    jet_spacing_vs_rhines_length: fitColumns(
      done,
      'rhines_length',
      'jet_spacing',
      'jet_spacing = A · rhines_length^b, rhines_length = 2π/k_rhines',
      options,
    ),
    u_rms_vs_balance_velocity: fitColumns(
      done,
      'balance_velocity',
      'u_rms',
      'u_rms = A · balance_velocity^b, balance_velocity = (eps/mu)^½',
      options,
    ),
    eddy_diffusivity_vs_supercriticality: fitColumns(
      done,
      'supercriticality',
      'diffusivity_scaled',
      'diffusivity_scaled = A · supercriticality^b, diffusivity_scaled = eddy_diffusivity/(Uλ), U = shear/2, λ = 1/kd',
      options,
      2,
    ),
    eddy_velocity_vs_supercriticality: fitColumns(
      done,
      'supercriticality',
      'velocity_scaled',
      'velocity_scaled = A · supercriticality^b, velocity_scaled = eddy_velocity/U, U = shear/2',
      options,
    ),
  };
}

function fitColumns(
  rows: readonly TableRow[],
  xName: string,
  yName: string,
  law: string,
  options: ScalingFitOptions,
  fixedExponent = 1,
): FitReport {
  const num = (v: unknown) => (typeof v === 'number' ? v : NaN);
  const x = rows.map((r) => num(r[xName]));
  const y = rows.map((r) => num(r[yName]));
  // Each run weighs by its own standard errors (the `*_stderr` columns), where the table has them.
  const error = (name: string) =>
    rows.map((r) => (typeof r[`${name}_stderr`] === 'number' ? (r[`${name}_stderr`] as number) : null));
  const level = options.level ?? 0.95;
  const resamples = options.resamples ?? 2000;
  const empty = {
    law,
    x: xName,
    y: yName,
    exponent: null,
    exponent_ci: null,
    prefactor: null,
    prefactor_ci: null,
    prefactor_at_exponent_1: null,
    prefactor_at_exponent_1_ci: null,
    fixed_exponent: fixedExponent,
    prefactor_at_fixed_exponent: null,
    prefactor_at_fixed_exponent_ci: null,
    log_residual_rms: null,
    level,
    resamples,
    degenerate_resamples: 0,
  };
  try {
    const f = fitScaling(x, y, { ...options, fixedExponent, yError: error(yName), xError: error(xName) });
    const one = fixedExponent === 1;
    return {
      ...empty,
      n: f.n,
      skipped: f.skipped,
      exponent: f.exponent,
      exponent_ci: f.exponentCI,
      prefactor: f.prefactor,
      prefactor_ci: f.prefactorCI,
      prefactor_at_exponent_1: one ? f.fixed!.prefactor : null,
      prefactor_at_exponent_1_ci: one ? f.fixed!.prefactorCI : null,
      prefactor_at_fixed_exponent: f.fixed!.prefactor,
      prefactor_at_fixed_exponent_ci: f.fixed!.prefactorCI,
      log_residual_rms: f.logResidualRms,
      degenerate_resamples: f.degenerate,
      error: null,
    };
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    const usable = x.filter((xi, i) => xi > 0 && y[i] > 0 && Number.isFinite(xi) && Number.isFinite(y[i])).length;
    return { ...empty, n: usable, skipped: rows.length - usable, error: e.message.replace(/^fitScaling: /, '') };
  }
}
