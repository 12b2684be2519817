import { describe, expect, it } from 'vitest';
import { isInputError } from '../../lib/inputError';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { MAX_RUN_STEPS, resolveRunPlan } from '../../lib/run/runPlan';

const p = { ...DEFAULT_PARAMS, mu: 0.02, dt: 0.01 };

function refused(req: Parameters<typeof resolveRunPlan>[1], start = 0): string {
  try {
    resolveRunPlan(p, req, start);
  } catch (e) {
    if (isInputError(e, 'run length')) return e.field;
    throw e;
  }
  throw new Error('accepted');
}

describe('run plans', () => {
  it('fill the stated defaults', () => {
    expect(resolveRunPlan(p, { steps: 100 })).toEqual({
      stop: { kind: 'steps', steps: 100 },
      average: 50,
      sampleEvery: 0.1,
    });
    expect(resolveRunPlan(p, { until: 20 }, 5).average).toBe(15); // the default window fits the run
    expect(resolveRunPlan(p, { untilSteady: true }, 10).stop).toEqual({
      kind: 'steady',
      window: 25,
      tolerance: 0.05,
      maxTime: 510,
    });
  });

  it('refuse what cannot be run, naming the field', () => {
    expect(refused({})).toBe('length');
    expect(refused({ steps: 10, until: 5 })).toBe('length');
    expect(refused({ steps: 0 })).toBe('steps');
    expect(refused({ until: 5 }, 5)).toBe('until');
    expect(refused({ until: 5, average: 6 })).toBe('average');
    expect(refused({ steps: 5, sampleEvery: 0.001 })).toBe('sampleEvery');
    expect(refused({ steps: 5, steadyTolerance: 0.1 })).toBe('steadyTolerance');
    expect(refused({ untilSteady: true, maxTime: 30 })).toBe('maxTime');
    expect(() => resolveRunPlan({ ...p, mu: 0 }, { untilSteady: true })).toThrow(/steadyWindow/);
  });

  it('refuse a run that would count more than MAX_RUN_STEPS steps, by the least count its dt gives', () => {
    expect(MAX_RUN_STEPS).toBe(2147483647); // the largest 32-bit signed integer, the NetCDF step type
    expect(resolveRunPlan(p, { steps: MAX_RUN_STEPS }).stop).toEqual({ kind: 'steps', steps: MAX_RUN_STEPS });
    expect(refused({ steps: MAX_RUN_STEPS + 1 })).toBe('steps');
    // until: at least (T − start)/dt steps, dt being the largest step; here 0.01 per step.
    expect(resolveRunPlan(p, { until: 2e7 }).stop.kind).toBe('until');
    expect(refused({ until: 2.2e7 })).toBe('until');
    expect(refused({ untilSteady: true, maxTime: 3e7 })).toBe('maxTime');
    // A resumed run counts from where it starts.
    expect(() => resolveRunPlan(p, { steps: 10 }, 0, MAX_RUN_STEPS - 5)).toThrow(
      /steps 10 is beyond the most a run may count, 2147483647, from its start at step 2147483642/,
    );
    expect(() => resolveRunPlan({ ...p, dt: 1e-300 }, { until: 1 })).toThrow(
      'until 1 means a step count of at least 1e+300 at dt = 1e-300, beyond the most a run may count, 2147483647: give a larger dt or a shorter run',
    );
  });
});
