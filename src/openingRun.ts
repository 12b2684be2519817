import type { ModelParams } from '../lib/model/params';
import { validateParams } from '../lib/model/validateParams';
import { DEFAULT_SCENARIO_ID, DEMO_SCENARIOS } from '../lib/plan/demoScenarios';
import { decodeRunLink } from './share/runLink';

// Completed once: the page compares the run's parameters with every scenario at each snapshot.
const completed = new Map(DEMO_SCENARIOS.map((s) => [s.id, Object.freeze(validateParams(s.params))]));

/** A scenario's parameters, completed with the model defaults (a fresh copy). */
export function scenarioParams(id: string): ModelParams {
  const p = completed.get(id) ?? completed.get(DEFAULT_SCENARIO_ID);
  if (!p) throw new Error(`no scenario "${id}" and no default scenario`);
  return { ...p };
}

/** The scenario whose parameters are exactly `p`, or null. */
export function matchScenario(p: ModelParams): string | null {
  for (const [id, q] of completed) {
    if ((Object.keys(q) as (keyof ModelParams)[]).every((k) => q[k] === p[k])) return id;
  }
  return null;
}

export interface OpeningRun {
  params: ModelParams;
  /** Why the link in the address could not be used (the default scenario opens instead), or null. */
  linkError: string | null;
}

/** What the page opens on: the run in the link, or the default scenario (with the reason when the link was bad). */
export function openingRun(hash: string): OpeningRun {
  const link = decodeRunLink(hash);
  if (link.kind === 'run') return { params: link.params, linkError: null };
  return { params: scenarioParams(DEFAULT_SCENARIO_ID), linkError: link.kind === 'bad' ? link.message : null };
}
