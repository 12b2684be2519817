import {
  balanceVelocity,
  dissipationWavenumber,
  frictionWavenumber,
  regimeOf,
  rhinesLength,
  rhinesWavenumber,
  RHINES_DEFINITIONS,
  steadyZonostrophyIndex,
  transitionalWavenumber,
  zonostrophyIndex,
  type Regime,
  type RhinesConvention,
} from '../lib/analysis/scales';
import type { StepReport } from '../lib/model/budget';
import type { ModelParams } from '../lib/model/params';
import { keptRadius } from '../lib/model/validateParams';

/** rms velocity from the kinetic energy per unit mass, U_rms = (2·KE)^½ (model units L/T). */
export function rmsVelocity(kinetic: number): number {
  return Math.sqrt(2 * Math.max(0, kinetic));
}

/** The zonostrophy index of a run: R_β = k_β/k_R with k_β from β and ε, k_R = (β/2U)^½ from a velocity U. */
export interface Zonostrophy {
  U: number;
  kBeta: number;
  kR: number;
  R: number;
  regime: Regime;
}

/** R_β for velocity U; null when it is undefined (no β, no forcing or no motion yet). */
export function zonostrophyAt(p: ModelParams, U: number): Zonostrophy | null {
  if (!(p.beta > 0 && p.eps > 0 && U > 0)) return null;
  const kBeta = transitionalWavenumber(p.beta, p.eps);
  const kR = rhinesWavenumber(p.beta, U);
  const R = zonostrophyIndex(kBeta, kR);
  return { U, kBeta, kR, R, regime: regimeOf(R) };
}

/** The rungs of the scale ladder, one per length scale of a run (formulas in lib/analysis/scales.ts). */
export type ScaleId =
  'domain' | 'rhines' | 'transitional' | 'friction' | 'forcing' | 'deformation' | 'dissipation' | 'grid';

/** One wavenumber of the ladder (k in rad per L; a length ℓ sits at k = 2π/ℓ). */
export interface Rung {
  id: ScaleId;
  symbol: string;
  k: number;
  /** What it is and where it comes from. */
  title: string;
}

export interface ScaleLadder {
  /** Set by the parameters alone: the same predicted and measured. */
  fixed: Rung[];
  /** From U = (ε/μ)^½ and the injected enstrophy rate. */
  predicted: Rung[];
  /** From the measured U_rms and the enstrophy the hyperviscosity actually removes. */
  measured: Rung[];
  predictedU: number | null;
  measuredU: number;
  predictedR: number | null;
  measuredR: number | null;
}

const positive = (k: number) => Number.isFinite(k) && k > 0;

/** Rhines rung in the chosen convention: its length L_R placed at k = 2π/L_R. */
function rhinesRung(p: ModelParams, U: number, convention: RhinesConvention, source: string): Rung[] {
  if (!(p.beta > 0 && U > 0)) return [];
  const k = (2 * Math.PI) / rhinesLength(p.beta, U, convention);
  const symbol = convention === 'kR' ? 'k_R' : '2π/L_R';
  return [{ id: 'rhines', symbol, k, title: `Rhines, ${RHINES_DEFINITIONS[convention].label}, ${source}` }];
}

function dissipationRung(p: ModelParams, eta: number, source: string): Rung[] {
  if (!(p.nu > 0 && eta > 0)) return [];
  return [
    {
      id: 'dissipation',
      symbol: 'k_ν',
      k: dissipationWavenumber(eta, p.nu, p.nu_order),
      title: `hyperviscous dissipation (η^⅓/ν)^{1/2p}, ${source}`,
    },
  ];
}

/**
 * Every wavenumber of a run, predicted beside measured, from the parameters and the latest step
 * report (the worker's; the UI holds no model). Predicted: U = (ε/μ)^½ and the injected enstrophy
 * rate η (report.enstrophy.injection, exact for the forced annulus). Measured: U_rms = (2·KE)^½ and
 * the rate at which hyperviscosity removes enstrophy (the η that actually reaches small scales).
 */
export function scaleLadder(p: ModelParams, report: StepReport, convention: RhinesConvention): ScaleLadder {
  const fixed: Rung[] = [
    { id: 'domain', symbol: 'k_L', k: (2 * Math.PI) / Math.max(p.Lx, p.Ly), title: 'domain, 2π/max(Lx, Ly)' },
  ];
  if (p.beta > 0 && p.eps > 0)
    fixed.push({
      id: 'transitional',
      symbol: 'k_β',
      k: transitionalWavenumber(p.beta, p.eps),
      title: 'transitional, (β³/ε)^⅕',
    });
  if (p.mu > 0 && p.eps > 0)
    fixed.push({ id: 'friction', symbol: 'k_fric', k: frictionWavenumber(p.mu, p.eps), title: 'friction, (μ³/ε)^½' });
  if (p.forcing !== 'none') fixed.push({ id: 'forcing', symbol: 'k_f', k: p.kf, title: `forcing, annulus ±${p.dkf}` });
  if (p.kd > 0) fixed.push({ id: 'deformation', symbol: 'k_d', k: p.kd, title: 'deformation, 1/L_d' });
  fixed.push({ id: 'grid', symbol: 'k_max', k: keptRadius(p), title: 'grid, largest kept disc (2/3 rule)' });

  const predictedU = p.mu > 0 && p.eps > 0 ? balanceVelocity(p.eps, p.mu) : null;
  const predicted = [
    ...(predictedU ? rhinesRung(p, predictedU, convention, 'U = (ε/μ)^½') : []),
    ...dissipationRung(p, report.enstrophy.injection, 'injected η'),
  ];
  const measuredU = rmsVelocity(report.kinetic);
  const measured = [
    ...rhinesRung(p, measuredU, convention, 'measured U_rms'),
    ...dissipationRung(p, report.enstrophy.hyper, 'hyperviscous η'),
  ];
  const predictedR = predictedU && p.beta > 0 ? steadyZonostrophyIndex(p.beta, p.eps, p.mu) : null;
  return {
    fixed: fixed.filter((r) => positive(r.k)),
    predicted: predicted.filter((r) => positive(r.k)),
    measured: measured.filter((r) => positive(r.k)),
    predictedU,
    measuredU,
    predictedR,
    measuredR: zonostrophyAt(p, measuredU)?.R ?? null,
  };
}
