/**
 * Stria's planner: what a beta-plane turbulence run with given parameters will give, whether it is
 * worth its cost, and a matched cheap run to try first. Pure TypeScript (no DOM, no Node APIs).
 *
 *   analysePlan(input)        validate → resolve → predict → check → cost → matched run, in one call
 *   planReportMarkdown/Html   the printable report of an analysis (planReport.ts)
 *   serializePlanFile/parsePlanFile   the versioned plan file (planFile.ts)
 *   PLAN_PRESETS              demonstration scenarios on real planetary constants (planPresets.ts)
 *
 * Units, formulas and thresholds: docs/plan.md.
 */
import { analyseBaroclinic, type BaroclinicAnalysis } from './baroclinicPlan';
import { checkPlan, type PlanCheck } from './checks';
import { forcedModesForCost, runCost, type RunCost } from './cost';
import { matchedRun, type MatchedRun, type MatchedRunOptions } from './matchedRun';
import { predictPlan, type PlanPredictions } from './predictions';
import { resolvePlan, type ResolvedPlan } from './resolvePlan';
import { planScaling, type UnitScaling } from './units';

/** Everything the planner says about one plan: the Plan view and `stria plan` show this. */
export interface PlanAnalysis {
  plan: ResolvedPlan;
  /** Stria's unit scaling of the plan (identity for a model-unit plan). */
  scaling: UnitScaling;
  predictions: PlanPredictions;
  checks: PlanCheck[];
  /** The planned run's cost if it were run with Stria's model on this machine (× speed). */
  cost: RunCost;
  /** The matched cheap run, or null with `matchedError` when no grid can hold one. */
  matched: MatchedRun | null;
  matchedError: string | null;
  /** The same checks applied to the matched run. */
  matchedChecks: PlanCheck[];
  /**
   * A baroclinic drive (two layers, imposed shear; baroclinicPlan.ts): its predictions, checks, cost
   * and matched run; null for a stirred plan. A baroclinic plan's `checks` are its own (the one-layer
   * checks of the forcing do not apply), `cost` is the two-layer run's, and the one-layer `matched`
   * is null (its matched run is `baroclinic.matched`).
   */
  baroclinic: BaroclinicAnalysis | null;
}

/**
 * Resolve, predict, check, cost and match a plan input. Throws an InputError of source 'plan input'
 * for an invalid input; everything after validation is reported, not thrown.
 */
export function analysePlan(input: unknown, opts: MatchedRunOptions = {}): PlanAnalysis {
  const plan = resolvePlan(input);
  const predictions = predictPlan(plan);
  const baroclinic = analyseBaroclinic(plan, opts);
  if (baroclinic)
    return {
      plan,
      scaling: planScaling(plan),
      predictions,
      checks: baroclinic.checks,
      cost: baroclinic.cost,
      matched: null,
      matchedError: 'a baroclinic plan has its own two-layer matched run (baroclinic.matched)',
      matchedChecks: [],
      baroclinic,
    };
  const checks = checkPlan(plan, predictions);
  const modes = forcedModesForCost({ nx: plan.nx, ny: plan.ny, Lx: plan.Lx, Ly: plan.Ly, kf: plan.kf, dkf: plan.dkf });
  const cost = runCost(plan.nx, plan.ny, predictions.stepsPlanned.value, modes, opts.speed ?? 1, opts.reference);
  let matched: MatchedRun | null = null;
  let matchedError: string | null = null;
  try {
    matched = matchedRun(plan, predictions, opts);
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    matchedError = e.message;
  }
  return {
    plan,
    scaling: planScaling(plan),
    predictions,
    checks,
    cost,
    matched,
    matchedError,
    matchedChecks: matched ? checkPlan(matched.plan, matched.predictions) : [],
    baroclinic: null,
  };
}
