import type { PlanPredictions } from './predictions';
import type { ResolvedPlan } from './resolvePlan';

/**
 * The dimensionless ratios that define a run independently of its units and size; a matched run
 * keeps them. Key: R_β, jets per domain (Ly over the jet spacing of the plan's Rhines convention),
 * k_f/k_R, k_max/k_f. Secondary: k_d/k_R, τ/τ_f (grid-scale damping time over the forcing-scale
 * turnover time (ε k_f²)^{−1/3}), δk/k_f, μT (run length in drag times), Ly/Lx.
 */
export type RatioId =
  | 'RBeta'
  | 'jetsPerDomain'
  | 'kfOverKR'
  | 'kmaxOverKf'
  | 'kdOverKR'
  | 'gridDampingOverTurnover'
  | 'annulusHalfWidth'
  | 'runDragTimes'
  | 'aspect';

export type RatioSet = Record<RatioId, number>;

/** The ratios of a plan (from its resolved inputs and predictions). */
export function planRatios(plan: ResolvedPlan, pred: PlanPredictions): RatioSet {
  return {
    RBeta: pred.R_beta.value,
    jetsPerDomain: pred.jetsRhines.value,
    kfOverKR: plan.kf / pred.kR.value,
    kmaxOverKf: plan.kMax / plan.kf,
    kdOverKR: plan.kd / pred.kR.value,
    gridDampingOverTurnover: plan.gridDampingTime / pred.turnoverForcing.value,
    annulusHalfWidth: plan.dkf / plan.kf,
    runDragTimes: plan.mu * plan.runLength,
    aspect: plan.Ly / plan.Lx,
  };
}
