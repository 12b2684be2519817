import fc from 'fast-check';
import { isInputError } from '../../../lib/inputError';
import { fitScaling } from '../../../lib/analysis/scalingFit';
import { DEFAULT_PARAMS } from '../../../lib/model/params';
import { expandSweep } from '../../../lib/sweep/sweepRuns';
import { parseSweepSpec } from '../../../lib/sweep/sweepSpec';
import { PropertyFailure, type Boundary } from '../support/boundary';
import { applyEdits, editsArbitrary, stepsCleanly, trickyKey, weirdValue } from '../support/weird';

/**
 * parseSweepSpec then expandSweep: specs built from random parts (swept names including inherited
 * and tricky keys, value lists, log ranges with any count, replicas, lengths, fit options), valid
 * specs with JSON edits, and any value. A refusal is an InputError of source 'sweep spec' naming a
 * field its message shows; an accepted spec expands within the time limit into runs whose first one
 * steps cleanly, and its fit options fit four points within the time limit too.
 */
const base = { nx: 32, ny: 32, kf: 8, dkf: 1.5, mu: 0.05, eps: 0.05, nu: 1e-8, dt: 0.05 };
const good = { base, vary: [{ param: 'beta', values: [5, 20] }], replicas: 2, length: { until: 30 }, average: 15 };

const paramName = fc.oneof(fc.constantFrom(...Object.keys(DEFAULT_PARAMS)), trickyKey, fc.string({ maxLength: 6 }));
const count = fc.oneof(fc.integer({ min: -2, max: 6 }), fc.constantFrom(1e4, 1e6, 1e9, 2 ** 31, 2 ** 53, 1.5, NaN));
const axis = fc.oneof(
  fc.record(
    {
      param: paramName,
      values: fc.array(fc.oneof(fc.double({ min: 0.5, max: 50, noNaN: true }), weirdValue), { maxLength: 4 }),
    },
    { requiredKeys: ['param'] },
  ),
  fc.record({
    param: paramName,
    logRange: fc.record(
      {
        from: fc.oneof(fc.double({ min: 0.1, max: 10 }), weirdValue),
        to: fc.oneof(fc.double({ min: 0.1, max: 100 }), weirdValue),
        count,
      },
      { requiredKeys: [] },
    ),
  }),
);
const length = fc.oneof(
  fc.record({ steps: count }),
  fc.record({ until: fc.oneof(fc.double({ min: 0.1, max: 100 }), weirdValue) }),
  fc.record(
    {
      untilSteady: fc.oneof(fc.constant(true), weirdValue),
      steadyTolerance: fc.double({ min: 0, max: 1 }),
      steadyWindow: fc.double({ min: 0, max: 100 }),
      maxTime: fc.double({ min: 0, max: 1e4 }),
    },
    { requiredKeys: ['untilSteady'] },
  ),
  weirdValue,
);
const spec = fc.record(
  {
    format: fc.oneof(fc.constant('stria-sweep'), weirdValue),
    version: fc.oneof(fc.constant(1), weirdValue),
    preset: fc.oneof(fc.constantFrom('jets', 'few-jets', 'nope'), weirdValue),
    base: fc.oneof(
      fc.constant(base),
      fc
        .record({
          nx: fc.constantFrom(32, 64, 33),
          beta: fc.oneof(fc.double({ min: 0, max: 50 }), weirdValue),
          kf: fc.constantFrom(8, 12, 40),
        })
        .map((r) => ({ ...base, ...r })),
      weirdValue,
    ),
    vary: fc.oneof(fc.array(axis, { maxLength: 3 }), weirdValue),
    replicas: fc.oneof(count, weirdValue),
    length,
    average: fc.oneof(fc.double({ min: 0.1, max: 100 }), weirdValue),
    sampleEvery: fc.oneof(fc.double({ min: 0.05, max: 10 }), weirdValue),
    fits: fc.oneof(
      fc.record(
        {
          resamples: count,
          seed: fc.oneof(fc.nat(), weirdValue),
          level: fc.oneof(fc.double({ min: 0, max: 1 }), weirdValue),
        },
        { requiredKeys: [] },
      ),
      weirdValue,
    ),
  },
  { requiredKeys: ['vary', 'length'] },
);

export const boundary: Boundary<unknown> = {
  arbitrary: fc.oneof(
    { weight: 4, arbitrary: spec },
    { weight: 3, arbitrary: editsArbitrary(2).map((e) => applyEdits(good, e)) },
    { weight: 1, arbitrary: fc.anything() },
  ),
  check(input) {
    let jobs;
    let fits;
    try {
      const s = parseSweepSpec(input);
      fits = s.fits;
      jobs = expandSweep(s);
    } catch (e) {
      if (!isInputError(e, 'sweep spec'))
        throw new PropertyFailure(
          `the sweep spec threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}, not an InputError of source 'sweep spec'`,
        );
      if (!e.field || !e.message.includes(e.field))
        throw new PropertyFailure(`an InputError of source 'sweep spec' names no field: ${e.message}`);
      return 'rejected';
    }
    if (jobs.length === 0) throw new PropertyFailure('an accepted spec makes no run');
    fitScaling([1, 2, 3, 4], [1.1, 1.9, 3.2, 3.9], fits);
    return stepsCleanly(jobs[0].params);
  },
};
