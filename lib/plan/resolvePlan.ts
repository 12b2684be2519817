import { derivePlan, type ResolvedPlan } from './derivePlan';
import { validatePlanInput } from './planInput';

export type { ResolvedPlan } from './derivePlan';

/** Validate `input` (an InputError of source 'plan input' on refusal) and derive the inputs the planner works from. */
export function resolvePlan(input: unknown): ResolvedPlan {
  return derivePlan(validatePlanInput(input));
}
