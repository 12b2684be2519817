import type { ModelParams } from '../../lib/model/params';
import { validateParams } from '../../lib/model/validateParams';
import { isInputError } from '../../lib/inputError';
import { scenarioParams } from '../openingRun';

/** Parameters a comparison may change, with how they are written. */
export const COMPARE_PARAMS = [
  { key: 'beta', symbol: 'β' },
  { key: 'kd', symbol: 'k_d' },
  { key: 'mu', symbol: 'μ' },
  { key: 'eps', symbol: 'ε' },
  { key: 'kf', symbol: 'k_f' },
  { key: 'nu', symbol: 'ν' },
] as const satisfies readonly { key: keyof ModelParams; symbol: string }[];

export type CompareKey = (typeof COMPARE_PARAMS)[number]['key'];

export interface CompareSetup {
  scenario: string;
  key: CompareKey;
  a: number;
  b: number;
}

/** The opening comparison: the default jets against the same run without β. */
export const DEFAULT_COMPARE: CompareSetup = { scenario: 'jets', key: 'beta', a: 0, b: 40 };

/**
 * The two runs of a comparison: the scenario with one parameter set to a and to b, the same seed and
 * everything else equal. Throws an InputError (naming the parameter) when a value is refused.
 */
export function compareRuns(setup: CompareSetup): [ModelParams, ModelParams] {
  const base = scenarioParams(setup.scenario);
  return [validateParams({ ...base, [setup.key]: setup.a }), validateParams({ ...base, [setup.key]: setup.b })];
}

/** Why a value would be refused for the parameter on top of the scenario, or null. */
export function refusal(setup: CompareSetup, value: number): string | null {
  try {
    validateParams({ ...scenarioParams(setup.scenario), [setup.key]: value });
    return null;
  } catch (e) {
    if (isInputError(e, 'parameters')) return e.issues.map((i) => i.message).join('; ');
    throw e;
  }
}

/**
 * The two values a newly chosen parameter starts from: for β and k_d, none against the scenario's
 * (or 4 when the scenario has none); for the rest, half the scenario's value against it.
 */
export function startingValues(scenario: string, key: CompareKey): { a: number; b: number } {
  const v = scenarioParams(scenario)[key];
  if (key === 'beta' || key === 'kd') return { a: 0, b: v > 0 ? v : 4 };
  return { a: v / 2, b: v };
}
