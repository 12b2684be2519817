import { isInputError } from '../../../lib/inputError';
import { analysePlan } from '../../../lib/plan/analysePlan';
import { validatePlanInput } from '../../../lib/plan/planInput';
import { PLAN_PRESETS } from '../../../lib/plan/planPresets';
import { validateParams } from '../../../lib/model/validateParams';
import { PropertyFailure } from './boundary';
import { stepsCleanly } from './weird';

/** Plan inputs to start from: the presets and a model-unit plan of the tests' own. */
export const PLAN_SEEDS: unknown[] = [
  ...PLAN_PRESETS.map((p) => p.input),
  {
    units: 'model',
    rotation: { kind: 'beta', beta: 50 },
    deformation: { kind: 'none' },
    drive: { kind: 'injection', eps: 0.02 },
    dragTime: 50,
    forcing: { wavelength: (2 * Math.PI) / 40, halfWidth: 0.05 },
    domain: { Lx: 2 * Math.PI, Ly: 2 * Math.PI },
    grid: { kind: 'points', nx: 512, ny: 512 },
    hyperviscosity: { order: 4, gridDampingTime: 0.1 },
    runLength: 500,
  },
];

/** NaN anywhere in a value (Infinity may be meant: an infinite deformation radius). */
function findNaN(x: unknown, path: string, seen = new Set<unknown>()): string | null {
  if (typeof x === 'number') return Number.isNaN(x) ? path : null;
  if (typeof x !== 'object' || x === null || seen.has(x)) return null;
  seen.add(x);
  for (const [k, v] of Object.entries(x)) {
    const p = findNaN(v, `${path}.${k}`, seen);
    if (p) return p;
  }
  return null;
}

/**
 * What an accepted plan input must give: an analysis without any error, no NaN among its
 * predictions, cost and matched run, and a matched run whose parameters the model accepts and
 * (on grids up to 128²) steps cleanly.
 */
export function analysesCleanly(input: unknown): string {
  let a;
  try {
    a = analysePlan(input);
  } catch (e) {
    throw new PropertyFailure(
      `accepted, then analysePlan threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`,
    );
  }
  for (const [part, value] of [
    ['predictions', a.predictions],
    ['cost', a.cost],
    ['plan', a.plan],
  ] as const) {
    const where = findNaN(value, part);
    if (where) throw new PropertyFailure(`accepted, then the analysis has NaN at ${where}`);
  }
  // validatePlanInput refuses a plan whose predictions leave the doubles (a subnormal drag time, say).
  const infinite = Object.values(a.predictions).find((p) => !Number.isFinite(p.value));
  if (infinite) throw new PropertyFailure(`accepted, then the prediction ${infinite.id} is ${infinite.value}`);
  if (!a.matched) return 'accepted, no matched run';
  const nan = findNaN(a.matched.predictions, 'matched.predictions');
  if (nan) throw new PropertyFailure(`accepted, then the matched run has NaN at ${nan}`);
  let p;
  try {
    p = validateParams(a.matched.params);
  } catch (e) {
    if (isInputError(e, 'parameters'))
      throw new PropertyFailure(`accepted, then the matched run's parameters are refused by the model: ${e.message}`);
    throw e;
  }
  if (p.nx * p.ny > 128 * 128) return 'accepted';
  return stepsCleanly(p) === 'accepted' ? 'accepted, matched run stepped' : 'accepted, matched run blew up';
}

/** An InputError of source 'plan input' is clean when it lists issues whose fields its message names. */
export function cleanPlanInputError(e: unknown): string | null {
  if (!isInputError(e, 'plan input'))
    return `threw ${e instanceof Error ? e.name : typeof e}, not an InputError of source 'plan input'`;
  if (e.issues.length === 0) return 'an InputError of source "plan input" with no issue';
  for (const i of e.issues)
    if (typeof i.field !== 'string' || !e.message.includes(i.field))
      return `an issue's field ${JSON.stringify(i.field)} is not in the message`;
  return null;
}

export { validatePlanInput };
