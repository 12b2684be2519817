import { fitScaling, type ScalingFitOptions } from '../analysis/scalingFit';
import type { TableRow } from './sweepTable';

/**
 * The scaling laws a sweep checks, fitted across its finished runs (log-log least squares weighted by
 * each run's standard errors, with seeded bootstrap percentile intervals, lib/analysis/scalingFit.ts):
 *   jet spacing against the Rhines length 2π/k_R (measured U): L_jet = A (2π/k_R)^b; b = 1 and an
 *     O(1) prefactor is the Rhines scaling of jets (Rhines 1975), so the prefactor at b = 1 is given too;
 *   u_rms against the drag balance (ε/μ)^½: u_rms = A ((ε/μ)^½)^b; b = 1, A = 1 when drag alone
 *     balances the injection, A < 1 by the share the hyperviscosity takes.
 * A fit that cannot be made (fewer than 3 usable runs, or one distinct x) says why instead.
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
  log_residual_rms: number | null;
  level: number;
  resamples: number;
  degenerate_resamples: number;
  error: string | null;
}

export interface SweepFits {
  jet_spacing_vs_rhines_length: FitReport;
  u_rms_vs_balance_velocity: FitReport;
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
  };
}

function fitColumns(
  rows: readonly TableRow[],
  xName: string,
  yName: string,
  law: string,
  options: ScalingFitOptions,
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
    log_residual_rms: null,
    level,
    resamples,
    degenerate_resamples: 0,
  };
  try {
    const f = fitScaling(x, y, { ...options, fixedExponent: 1, yError: error(yName), xError: error(xName) });
    return {
      ...empty,
      n: f.n,
      skipped: f.skipped,
      exponent: f.exponent,
      exponent_ci: f.exponentCI,
      prefactor: f.prefactor,
      prefactor_ci: f.prefactorCI,
      prefactor_at_exponent_1: f.fixed!.prefactor,
      prefactor_at_exponent_1_ci: f.fixed!.prefactorCI,
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
