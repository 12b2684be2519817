import * as v from 'valibot';
import { InputError } from '../inputError';
import { DEFAULT_PARAMS } from '../model/params';
import { DEMO_SCENARIOS } from '../plan/demoScenarios';
import { namedValues } from '../io/namedValues';

/**
 * The sweep spec: which runs a sweep makes and how each is measured (JSON; docs/cli.md).
 *
 *   { "format": "stria-sweep", "version": 1,                 (optional, checked when given)
 *     "title": "…",                                         (optional)
 *     "preset": "jets",                                     (optional: a demo scenario to start from)
 *     "base": { "nx": 64, "beta": 20, … },                  (parameters over the preset or the defaults)
 *     "vary": [ { "param": "beta", "values": [10, 20, 40] },
 *               { "param": "eps", "logRange": { "from": 0.01, "to": 0.1, "count": 3 } } ],
 *     "replicas": 2,                                        (seeds base.seed, base.seed + 1, …)
 *     "length": { "until": 200 } | { "steps": 4000 } | { "untilSteady": true, … },
 *     "average": 100, "sampleEvery": 0.5,                   (optional: RunPlan defaults)
 *     "fits": { "resamples": 2000, "seed": 1, "level": 0.95 } }
 *
 * One or two swept parameters, each a list of values or a logarithmic range (count values from
 * `from` to `to` inclusive, equally spaced in log, inner ones to 12 significant digits). Two give
 * every combination.
 */
export const SWEEP_FORMAT = 'stria-sweep';
export const SWEEP_VERSION = 1;
/**
 * Most runs a spec may make, and most bootstrap resamples of its fits. Both are far beyond any sweep
 * a machine or a cluster allocation finishes; they are there so that a typo (a count of 1e9) is
 * refused at once instead of expanding for hours or exhausting the memory.
 */
export const MAX_SWEEP_RUNS = 100_000;
export const MAX_RESAMPLES = 1_000_000;

const positive = (what: string) =>
  v.pipe(v.number(`${what}: a number`), v.finite(`${what}: must be finite`), v.gtValue(0, `${what}: must be > 0`));
const count = (what: string, min: number) =>
  v.pipe(
    v.number(`${what}: a number`),
    v.integer(`${what}: must be an integer`),
    v.minValue(min, `${what}: must be ≥ ${min}`),
  );
const paramValue = v.union([v.number(), v.boolean(), v.string()], 'must be a number, true/false or a text');

const AxisSchema = v.strictObject(
  {
    param: v.string('must be the name of a parameter'),
    values: v.optional(
      v.pipe(v.array(paramValue, 'must be a list of values'), v.minLength(1, 'must hold at least one value')),
    ),
    logRange: v.optional(
      v.strictObject(
        { from: positive('from'), to: positive('to'), count: count('count', 2) },
        'must be { from, to, count }',
      ),
    ),
  },
  'must be { param, values } or { param, logRange }',
);

const LengthSchema = v.strictObject(
  {
    steps: v.optional(count('steps', 1)),
    until: v.optional(positive('until')),
    untilSteady: v.optional(v.literal(true, 'must be true')),
    steadyTolerance: v.optional(positive('steadyTolerance')),
    steadyWindow: v.optional(positive('steadyWindow')),
    maxTime: v.optional(positive('maxTime')),
  },
  'must be { steps }, { until } or { untilSteady: true, … }',
);

export const SweepSpecSchema = v.strictObject(
  {
    format: v.optional(v.literal(SWEEP_FORMAT, `must be "${SWEEP_FORMAT}"`)),
    version: v.optional(
      v.literal(SWEEP_VERSION, `must be ${SWEEP_VERSION}: this Stria reads sweep specs of version ${SWEEP_VERSION}`),
    ),
    title: v.optional(v.string('must be a text')),
    preset: v.optional(
      v.picklist(
        DEMO_SCENARIOS.map((s) => s.id),
        `must be one of ${DEMO_SCENARIOS.map((s) => `"${s.id}"`).join(', ')}`,
      ),
    ),
    base: v.optional(namedValues('must be an object of named parameters'), {}),
    vary: v.pipe(
      v.array(AxisSchema, 'must be a list of one or two swept parameters'),
      v.minLength(1, 'must name at least one swept parameter'),
      v.maxLength(2, 'sweeps one or two parameters'),
    ),
    replicas: v.optional(count('replicas', 1), 1),
    length: LengthSchema,
    average: v.optional(positive('average')),
    sampleEvery: v.optional(positive('sampleEvery')),
    fits: v.optional(
      v.strictObject({
        resamples: v.optional(
          v.pipe(count('resamples', 0), v.maxValue(MAX_RESAMPLES, `resamples: must be ≤ ${MAX_RESAMPLES}`)),
        ),
        seed: v.optional(v.pipe(count('seed', 0), v.maxValue(0xffffffff, 'seed: must be ≤ 4294967295'))),
        level: v.optional(
          v.pipe(v.number('level: a number'), v.gtValue(0, 'level: must be > 0'), v.ltValue(1, 'level: must be < 1')),
        ),
      }),
      {},
    ),
  },
  'must be an object',
);

export type SweepSpec = v.InferOutput<typeof SweepSpecSchema>;
export type SweepAxis = SweepSpec['vary'][number];

/**
 * Check a parsed JSON value as a sweep spec; throws an InputError of source 'sweep spec' naming the
 * first bad field (its dotted path, e.g. "vary.0.logRange.count").
 */
export function parseSweepSpec(json: unknown): SweepSpec {
  const parsed = v.safeParse(SweepSpecSchema, json);
  if (!parsed.success) {
    const issue = parsed.issues[0];
    const path = issue.path?.map((p) => String(p.key)).join('.') || '(spec)';
    const unknownKey = issue.kind === 'schema' && issue.type === 'strict_object' && issue.expected === 'never';
    throw new InputError('sweep spec', path, unknownKey ? 'is not a field of a sweep spec here' : issue.message);
  }
  const spec = parsed.output;
  const seen = new Set<string>();
  spec.vary.forEach((axis, i) => {
    // Own keys only: "toString" or "__proto__" are found on every object but are not parameters.
    if (!Object.hasOwn(DEFAULT_PARAMS, axis.param))
      throw new InputError(
        'sweep spec',
        `vary.${i}.param`,
        `"${axis.param}" is not a parameter (known: ${Object.keys(DEFAULT_PARAMS).join(', ')})`,
      );
    if (axis.param === 'seed')
      throw new InputError(
        'sweep spec',
        `vary.${i}.param`,
        'seeds are not swept: give "replicas" for runs with different seeds',
      );
    if (seen.has(axis.param)) throw new InputError('sweep spec', `vary.${i}.param`, `"${axis.param}" is swept twice`);
    seen.add(axis.param);
    if ((axis.values === undefined) === (axis.logRange === undefined))
      throw new InputError('sweep spec', `vary.${i}`, 'give exactly one of "values" and "logRange"');
    if (axis.logRange && typeof DEFAULT_PARAMS[axis.param as keyof typeof DEFAULT_PARAMS] !== 'number') {
      throw new InputError(
        'sweep spec',
        `vary.${i}.logRange`,
        `"${axis.param}" is not a number, so it has no logarithmic range`,
      );
    }
  });
  const given = (['steps', 'until', 'untilSteady'] as const).filter((k) => spec.length[k] !== undefined);
  if (given.length !== 1)
    throw new InputError(
      'sweep spec',
      'length',
      given.length
        ? `give one run length, not ${given.join(' and ')}`
        : 'give a run length: steps, until or untilSteady',
    );
  // Counted before anything is expanded, so the check itself costs nothing.
  const points = spec.vary.reduce((n, a) => n * (a.values ? a.values.length : a.logRange!.count), 1);
  if (points * spec.replicas > MAX_SWEEP_RUNS) {
    throw new InputError(
      'sweep spec',
      spec.replicas > 1 ? 'replicas' : 'vary',
      `the spec makes ${points * spec.replicas} runs (${points} points × ${spec.replicas} replicas), more than ${MAX_SWEEP_RUNS}: split it into several sweeps`,
    );
  }
  return spec;
}

/** The values of one axis, in order: the list, or `count` log-spaced values from `from` to `to`. */
export function axisValues(axis: SweepAxis): (number | boolean | string)[] {
  if (axis.values) return axis.values;
  const { from, to, count } = axis.logRange!;
  const a = Math.log(from);
  const step = (Math.log(to) - a) / (count - 1);
  // The ends are the numbers given, exactly; the inner points are exp of equally spaced logs,
  // rounded to 12 significant digits so that 20 to 80 in 3 gives 40, not 39.99999999999998.
  return Array.from({ length: count }, (_, k) =>
    k === 0 ? from : k === count - 1 ? to : Number(Math.exp(a + k * step).toPrecision(12)),
  );
}
