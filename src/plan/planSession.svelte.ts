import type { RunSummary } from '../../lib/analysis/summary';
import type { BaroclinicHeadline } from '../../lib/plan/baroclinicPlan';
import type { PlanInput } from '../../lib/plan/planInput';
import { PLAN_PRESETS, type PlanPreset } from '../../lib/plan/planPresets';
import type { PlanPredictions } from '../../lib/plan/predictions';
import type { UnitScaling } from '../../lib/plan/units';
import type { TrialPhase, TrialTrack } from './matchedTrial';

/** The matched run started here: what it was, what it predicted, and (once it ended) what it measured. */
export interface MatchedTrial extends TrialTrack {
  /** A stirred plan's predictions, or null for a baroclinic plan's run (then `headline`). */
  predictions: PlanPredictions | null;
  /** A baroclinic plan's Held & Larichev predictions under the run summary's keys, or null. */
  headline: BaroclinicHeadline | null;
  phase: TrialPhase;
  measured: RunSummary | null;
}

/**
 * The planner's state, kept while the Plan view is closed (a matched run goes on in the worker
 * meanwhile): the input as entered, possibly invalid, the preset it came from, the machine-speed
 * factor, the matched run's wall-time target, and the matched run tried here.
 */
class PlanSession {
  input = $state<PlanInput>(structuredClone(PLAN_PRESETS[0].input));
  preset = $state<PlanPreset['id'] | null>(PLAN_PRESETS[0].id);
  speed = $state(1);
  targetSeconds = $state(120);
  trial = $state.raw<MatchedTrial | null>(null);
  /**
   * The last switch from physical to model units: the physical plan, the model plan it became and the
   * scaling used, so that switching back undoes it exactly (or converts the edited plan with it).
   */
  unitSwitch = $state.raw<{ physical: PlanInput; model: PlanInput; scaling: UnitScaling } | null>(null);
}

export const planSession = new PlanSession();
