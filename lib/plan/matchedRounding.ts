import type { ModelParams } from '../model/params';
import { isInputError } from '../inputError';
import { keptRadius, validateParams } from '../model/validateParams';
import { checkPlan, type PlanCheck, type Severity } from './checks';
import type { PlanInput } from './planInput';
import { predictPlan, type PlanPredictions } from './predictions';
import { resolvePlan, type ResolvedPlan } from './resolvePlan';
import { IDENTITY_SCALING, planModelParams } from './units';

/**
 * The matched run's numbers as a person would type them. A matched run is worked out from ratios,
 * so its parameters come out as 72.00000014400001 or a run length of 153.84752630967034; this rounds
 * them to the fewest significant figures, from MATCHED_DIGITS up, at which the run still passes every
 * check it passed unrounded (and the model still takes it), trying nearest rounding first and then
 * each way of rounding the parameters up or down (a parameter at a check's floor may need to round
 * away from it). The time step, a largest step for the CFL-adaptive stepping, always rounds down.
 * When no rounding keeps the checks, the unrounded numbers stay (`digits` = 17).
 */
export const MATCHED_DIGITS = 4;
const MOST_DIGITS = 12;

/** A matched run worked out from its model-unit plan input. */
export interface MatchedForm {
  input: PlanInput;
  plan: ResolvedPlan;
  predictions: PlanPredictions;
  params: ModelParams;
  /** Significant figures the parameters were rounded to (17: not rounded). */
  digits: number;
}

type Direction = 'nearest' | 'up' | 'down';

/** x to `digits` significant figures, in the direction asked (toPrecision, exact in IEEE arithmetic). */
export function roundSignificant(x: number, digits: number, dir: Direction = 'nearest'): number {
  if (x === 0 || !Number.isFinite(x)) return x;
  const r = Number(x.toPrecision(digits));
  if (dir === 'nearest' || (dir === 'up' && r >= x) || (dir === 'down' && r <= x)) return r;
  // The exponent from the decimal text, not log10, whose last bit the engine chooses.
  const e = Number(r.toExponential().split('e')[1]) - digits + 1;
  const step = Number(`1e${e}`);
  return Number((dir === 'up' ? r + step : r - step).toPrecision(digits));
}

/** The form of `input` as it stands, or the reason the model or the planner refuses it. */
export function evaluateMatched(
  input: PlanInput,
  overrides: Partial<ModelParams> = {},
  digits = 17,
): MatchedForm | string {
  try {
    const plan = resolvePlan(input);
    const predictions = predictPlan(plan);
    const dt = overrides.dt ?? predictions.dtCFL.value;
    const params = validateParams({ ...planModelParams(plan, dt, IDENTITY_SCALING), ...overrides, dt });
    return { input, plan, predictions, params, digits };
  } catch (e) {
    // Refusals here (a parameter out of the model's range) make this grid unworkable, not the plan.
    if (isInputError(e, 'plan input') || isInputError(e, 'parameters')) return e.message;
    throw e;
  }
}

const RANK: Record<Severity, number> = { ok: 0, warning: 1, error: 2 };
const noWorse = (a: PlanCheck[], b: PlanCheck[]) => a.every((c, i) => RANK[c.severity] <= RANK[b[i].severity]);

/** Parameters rounded together, each up or down in the directed tries (μ = ε in a matched run). */
const FREE = ['beta', 'eps', 'kf', 'dkf', 'nu'] as const;

/** The matched run with its numbers rounded (see MATCHED_DIGITS). */
export function roundMatched(exact: MatchedForm): MatchedForm {
  const exactChecks = checkPlan(exact.plan, exact.predictions);
  for (let d = MATCHED_DIGITS; d <= MOST_DIGITS; d++) {
    const tries: Direction[][] = [FREE.map(() => 'nearest')];
    for (let mask = 0; mask < 1 << FREE.length; mask++)
      tries.push(FREE.map((_, i) => ((mask >> i) & 1 ? 'up' : 'down')));
    for (const dirs of tries) {
      const form = roundedForm(exact, d, dirs);
      if (typeof form !== 'string' && noWorse(checkPlan(form.plan, form.predictions), exactChecks)) return form;
    }
  }
  return exact;
}

function roundedForm(exact: MatchedForm, d: number, dirs: Direction[]): MatchedForm | string {
  const p = exact.params;
  const [beta, eps, kf, dkf, nu] = FREE.map((k, i) => roundSignificant(p[k], d, dirs[i]));
  const mu = Math.abs(p.mu / p.eps - 1) < 1e-12 ? eps : roundSignificant(p.mu, d);
  const kd = roundSignificant(p.kd, d);
  const order = exact.plan.order;
  const kMax = keptRadius(p);
  const input: PlanInput = {
    ...exact.input,
    rotation: { kind: 'beta', beta },
    deformation: kd > 0 ? { kind: 'radius', Ld: 1 / kd } : { kind: 'none' },
    drive: { kind: 'injection', eps },
    dragTime: 1 / mu,
    forcing: { wavelength: (2 * Math.PI) / kf, halfWidth: dkf / kf },
    hyperviscosity: { order, gridDampingTime: 1 / (nu * Math.pow(kMax, 2 * order)) },
    runLength: roundSignificant(exact.input.runLength, d),
  };
  const first = evaluateMatched(input, { beta, mu, eps, kf, dkf, kd, nu }, d);
  if (typeof first === 'string') return first;
  // The step from the rounded plan's CFL estimate, rounded down: a largest step may only shrink.
  return evaluateMatched(
    input,
    { beta, mu, eps, kf, dkf, kd, nu, dt: roundSignificant(first.predictions.dtCFL.value, d, 'down') },
    d,
  );
}
