import type { ModelParams } from '../model/params';
import { InputError, isInputError } from '../inputError';
import { validateParams } from '../model/validateParams';
import { scenarioById } from '../plan/demoScenarios';
import { runId } from '../run/runId';
import { resolveRunPlan, type RunPlan } from '../run/runPlan';
import { axisValues, type SweepSpec } from './sweepSpec';

/** The swept values of one run, by parameter name. */
export type SweepPoint = Record<string, number | boolean | string>;

/** One run of a sweep, fully resolved: what a worker needs, and the id its result is kept under. */
export interface SweepJob {
  id: string;
  /** Position in the sweep's order (points in spec order, the first axis slowest; replicas fastest). */
  index: number;
  point: SweepPoint;
  replica: number;
  seed: number;
  params: ModelParams;
  plan: RunPlan;
}

/**
 * Every run of a sweep spec: the preset (if any), then `base`, then the swept values, then the
 * replica's seed (base seed + replica number), validated as model parameters, each with its RunPlan.
 * Throws an InputError of source 'sweep spec' naming the field when a combination is refused (so a sweep fails before it
 * starts, not halfway through).
 */
export function expandSweep(spec: SweepSpec): SweepJob[] {
  const preset = spec.preset ? scenarioById(spec.preset)!.params : {};
  let base: ModelParams;
  try {
    base = validateParams({ ...preset, ...spec.base });
  } catch (e) {
    if (isInputError(e, 'parameters'))
      throw new InputError('sweep spec', `base.${e.issues[0].field}`, e.issues.map((i) => i.message).join('; '));
    throw e;
  }
  const axes = spec.vary.map((a) => ({ param: a.param, values: axisValues(a) }));
  const points: SweepPoint[] =
    axes.length === 1
      ? axes[0].values.map((x) => ({ [axes[0].param]: x }))
      : axes[0].values.flatMap((x) => axes[1].values.map((y) => ({ [axes[0].param]: x, [axes[1].param]: y })));
  const jobs: SweepJob[] = [];
  for (const point of points) {
    for (let replica = 0; replica < spec.replicas; replica++) {
      const seed = base.seed + replica;
      if (seed > 0xffffffff)
        throw new InputError(
          'sweep spec',
          'replicas',
          `base seed ${base.seed} + ${replica} passes the largest seed 4294967295`,
        );
      let params: ModelParams;
      try {
        params = validateParams({ ...base, ...point, seed });
      } catch (e) {
        if (!isInputError(e, 'parameters')) throw e;
        const i = e.issues[0];
        const axis = spec.vary.findIndex((a) => a.param === i.field);
        const where = axis >= 0 ? `vary.${axis}` : `base.${i.field}`;
        throw new InputError(
          'sweep spec',
          where,
          `at ${describePoint(point)}: ${i.field} = ${String(i.value)}: ${i.message}`,
        );
      }
      let plan: RunPlan;
      try {
        plan = resolveRunPlan(params, { ...spec.length, average: spec.average, sampleEvery: spec.sampleEvery });
      } catch (e) {
        if (!isInputError(e, 'run length')) throw e;
        const field =
          e.field === 'average' || e.field === 'sampleEvery'
            ? e.field
            : `length${e.field === 'length' ? '' : `.${e.field}`}`;
        throw new InputError('sweep spec', field, `at ${describePoint(point)}: ${e.message}`);
      }
      jobs.push({ id: runId(params, plan), index: jobs.length, point, replica, seed, params, plan });
    }
  }
  const ids = new Set(jobs.map((j) => j.id));
  if (ids.size !== jobs.length)
    throw new InputError('sweep spec', 'vary', 'two runs of the sweep are the same run (a value is listed twice)');
  return jobs;
}

/** "beta = 10, eps = 0.01" */
export function describePoint(point: SweepPoint): string {
  return Object.entries(point)
    .map(([k, x]) => `${k} = ${String(x)}`)
    .join(', ');
}
