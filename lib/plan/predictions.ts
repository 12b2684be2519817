import {
  dissipationWavenumber,
  frictionWavenumber,
  REGIME_LABELS,
  regimeOf,
  RHINES_DEFINITIONS,
  rhinesLength,
  rhinesWavenumber,
  staircaseSpacing,
  steadyZonostrophyIndex,
  transitionalWavenumber,
  type Regime,
  type RhinesConvention,
} from '../analysis/scales';
import { REFERENCES } from './references';
import { RHINES_LABELS } from './rhinesLabels';
import type { ResolvedPlan } from './resolvePlan';
import { THRESHOLDS } from './thresholds';

/** What a prediction measures; the unit follows from the plan's unit system (see `unitLabel`). */
export type Quantity = 'velocity' | 'length' | 'wavenumber' | 'time' | 'rate' | 'enstrophyRate' | 'count' | 'ratio';

/** One predicted number, with the formula that gives it and the source of the formula. */
export interface Prediction {
  id: string;
  label: string;
  symbol: string;
  value: number;
  quantity: Quantity;
  /** The formula, as text for the app to show on hover. */
  formula: string;
  /** The source, as the check list gives it, with its mark. */
  reference: string;
  /** A word for non-numeric predictions (the regime). */
  text?: string;
}

export type RhinesId = `rhines_${RhinesConvention}`;
export type PredictionId =
  | 'U'
  | RhinesId
  | 'kR'
  | 'kBeta'
  | 'kFric'
  | 'eta'
  | 'kNu'
  | 'R_beta'
  | 'regime'
  | 'jetSpacingRhines'
  | 'jetSpacingStaircase'
  | 'jetsRhines'
  | 'jetsStaircase'
  | 'spinUpTime'
  | 'steadyTime'
  | 'turnoverForcing'
  | 'peakSpeed'
  | 'dtCFL'
  | 'stepsToSteady'
  | 'stepsPlanned';

export type PlanPredictions = Record<PredictionId, Prediction> & { regime: Prediction & { text: Regime } };

/**
 * Everything the plan predicts, in the plan's units. Assumes the linear-drag steady state
 * (U = (ε/μ)^½, hyperviscous loss neglected) unless the plan gives a target U, in which case ε = μU²
 * and the two agree. The jet spacings use the plan's Rhines convention and the staircase relation.
 */
export function predictPlan(plan: ResolvedPlan): PlanPredictions {
  const { beta, eps, mu, U, kf, nu, order, Ly, dx, dy, cfl, runLength } = plan;
  const conv = plan.input.rhines;
  const given = plan.input.drive.kind === 'velocity';
  const out: Partial<Record<PredictionId, Prediction>> = {};
  const put = (
    id: PredictionId,
    label: string,
    symbol: string,
    value: number,
    quantity: Quantity,
    formula: string,
    reference: string,
  ) => {
    out[id] = { id, label, symbol, value, quantity, formula, reference };
  };
  put(
    'U',
    'rms velocity',
    'U',
    U,
    'velocity',
    given ? 'U given as the target; ε = μU²' : 'U = (ε/μ)^½',
    REFERENCES.energyBalance,
  );
  for (const c of Object.keys(RHINES_DEFINITIONS) as RhinesConvention[]) {
    put(
      `rhines_${c}`,
      `Rhines length ${RHINES_LABELS[c]}`,
      'L_R',
      rhinesLength(beta, U, c),
      'length',
      RHINES_DEFINITIONS[c].label,
      REFERENCES.rhinesConventions,
    );
  }
  const kR = rhinesWavenumber(beta, U);
  put('kR', 'Rhines wavenumber', 'k_R', kR, 'wavenumber', 'k_R = (β/2U)^½', REFERENCES.rhines);
  const kBeta = transitionalWavenumber(beta, eps);
  put('kBeta', 'transitional wavenumber', 'k_β', kBeta, 'wavenumber', 'k_β = (β³/ε)^{1/5}', REFERENCES.transitional);
  put(
    'kFric',
    'friction wavenumber',
    'k_fric',
    frictionWavenumber(mu, eps),
    'wavenumber',
    'k_fric = (μ³/ε)^½',
    REFERENCES.friction,
  );
  const eta = kf * kf * eps;
  put('eta', 'enstrophy injection rate', 'η', eta, 'enstrophyRate', 'η = k_f² ε', REFERENCES.ringEnstrophy);
  put(
    'kNu',
    'dissipation wavenumber',
    'k_ν',
    dissipationWavenumber(eta, nu, order),
    'wavenumber',
    'k_ν = (η^{1/3}/ν)^{1/(2p)}',
    REFERENCES.dissipation,
  );
  const R = steadyZonostrophyIndex(beta, eps, mu);
  put('R_beta', 'zonostrophy index', 'R_β', R, 'ratio', 'R_β = k_β/k_R = √2 (β²ε/μ⁵)^{1/20}', REFERENCES.zonostrophy);
  const regime = regimeOf(R);
  out.regime = {
    id: 'regime',
    label: 'regime',
    symbol: 'regime',
    value: R,
    quantity: 'ratio',
    formula: 'R_β < 1.5 friction-dominated; 1.5–2.5 transitional; ≥ 2.5 zonostrophic',
    reference: REFERENCES.regime,
    text: regime,
  };
  const Lr = rhinesLength(beta, U, conv);
  put(
    'jetSpacingRhines',
    `jet spacing from the Rhines scale (${RHINES_LABELS[conv]})`,
    'L_jet',
    Lr,
    'length',
    RHINES_DEFINITIONS[conv].label,
    REFERENCES.rhinesConventions,
  );
  const Ls = staircaseSpacing(beta, U);
  put(
    'jetSpacingStaircase',
    'jet spacing of the ideal PV staircase',
    'L_stair',
    Ls,
    'length',
    'L = 720^{1/4} (U/β)^½ ≈ 5.1800 (U/β)^½',
    REFERENCES.staircase,
  );
  put(
    'jetsRhines',
    'jets in the domain (Rhines spacing)',
    'Ly/L_jet',
    Ly / Lr,
    'count',
    'Ly / L_jet',
    REFERENCES.practice,
  );
  put(
    'jetsStaircase',
    'jets in the domain (staircase spacing)',
    'Ly/L_stair',
    Ly / Ls,
    'count',
    'Ly / L_stair',
    REFERENCES.practice,
  );
  const spin = 1 / (2 * mu);
  put('spinUpTime', 'spin-up time (energy e-folding)', 't_spin', spin, 'time', 't_spin = 1/(2μ)', REFERENCES.spinUp);
  const steady = THRESHOLDS.steadyMultiple * spin;
  put(
    'steadyTime',
    'time to statistical steady state',
    't_ss',
    steady,
    'time',
    `t_ss = ${THRESHOLDS.steadyMultiple}/(2μ)`,
    REFERENCES.spinUp,
  );
  put(
    'turnoverForcing',
    'eddy turnover time at the forcing scale',
    'τ_f',
    Math.pow(eps * kf * kf, -1 / 3),
    'time',
    'τ_f = (ε k_f²)^{−1/3}',
    REFERENCES.turnover,
  );
  const peak = THRESHOLDS.peakToRms * U;
  put(
    'peakSpeed',
    `expected peak speed (peak/rms = ${THRESHOLDS.peakToRms})`,
    'u_peak',
    peak,
    'velocity',
    `u_peak = ${THRESHOLDS.peakToRms} U`,
    REFERENCES.cfl,
  );
  const dt = cflStep(cfl, peak, dx, dy);
  put('dtCFL', `time step at CFL ${cfl}`, 'dt', dt, 'time', 'dt = C / (u_peak/dx + u_peak/dy)', REFERENCES.cfl);
  put(
    'stepsToSteady',
    'steps to statistical steady state',
    'n_ss',
    Math.ceil(steady / dt),
    'count',
    'n_ss = ⌈t_ss / dt⌉',
    REFERENCES.practice,
  );
  put(
    'stepsPlanned',
    'steps in the planned run',
    'n_run',
    Math.ceil(runLength / dt),
    'count',
    'n_run = ⌈T_run / dt⌉',
    REFERENCES.practice,
  );
  return out as PlanPredictions;
}

/** The time step dt = C/(u_peak/dx + u_peak/dy) that gives CFL number C (the model's definition). */
export function cflStep(cfl: number, peakSpeed: number, dx: number, dy: number): number {
  return cfl / (peakSpeed / dx + peakSpeed / dy);
}

/** The regime of a prediction set, with its label from lib/analysis/scales. */
export function regimeLabel(p: PlanPredictions): string {
  return REGIME_LABELS[p.regime.text];
}
