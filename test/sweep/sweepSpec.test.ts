import { describe, expect, it } from 'vitest';
import { isInputError } from '../../lib/inputError';
import { axisValues, parseSweepSpec } from '../../lib/sweep/sweepSpec';
import { expandSweep } from '../../lib/sweep/sweepRuns';

const base = { nx: 32, ny: 32, kf: 8, dkf: 1.5, mu: 0.05, eps: 0.05, nu: 1e-8, dt: 0.05 };
const good = { base, vary: [{ param: 'beta', values: [5, 20] }], replicas: 2, length: { until: 30 }, average: 15 };

/** The field a refused spec names. */
function refusedField(spec: unknown): string {
  try {
    expandSweep(parseSweepSpec(spec));
  } catch (e) {
    if (isInputError(e, 'sweep spec')) return e.field;
    throw e;
  }
  throw new Error('the spec was accepted');
}

describe('sweep spec', () => {
  it('refuses malformed specs, naming the field', () => {
    expect(refusedField({ ...good, vary: [] })).toBe('vary');
    expect(refusedField({ ...good, vary: [{ param: 'beta' }] })).toBe('vary.0');
    expect(refusedField({ ...good, vary: [{ param: 'betta', values: [1] }] })).toBe('vary.0.param');
    expect(refusedField({ ...good, vary: [{ param: 'seed', values: [1, 2] }] })).toBe('vary.0.param');
    expect(refusedField({ ...good, vary: [{ param: 'beta', logRange: { from: 1, to: 10, count: 1 } }] })).toBe(
      'vary.0.logRange.count',
    );
    expect(refusedField({ ...good, vary: [{ param: 'forcing', logRange: { from: 1, to: 10, count: 3 } }] })).toBe(
      'vary.0.logRange',
    );
    expect(
      refusedField({
        ...good,
        vary: [
          { param: 'beta', values: [1] },
          { param: 'beta', values: [2] },
        ],
      }),
    ).toBe('vary.1.param');
    expect(refusedField({ ...good, length: {} })).toBe('length');
    expect(refusedField({ ...good, length: { steps: 10, until: 3 } })).toBe('length');
    expect(refusedField({ ...good, length: { steps: 1.5 } })).toBe('length.steps');
    expect(refusedField({ ...good, replicas: 0 })).toBe('replicas');
    expect(refusedField({ ...good, extra: 1 })).toBe('extra');
    expect(refusedField({ ...good, version: 2 })).toBe('version');
    expect(refusedField({ ...good, base: { ...base, kf: 'eight' } })).toBe('base.kf');
    // Keys a JSON parser keeps but a schema library may drop unseen are unknown parameters like any other.
    for (const key of ['__proto__', 'constructor'])
      expect(refusedField(JSON.parse(JSON.stringify(good).replace('"base":{', `"base":{"${key}":{"nx":64},`)))).toBe(
        `base.${key}`,
      );
    expect(refusedField({ ...good, average: 40 })).toBe('average');
    // A swept value the model refuses is named by its axis and point.
    expect(refusedField({ ...good, vary: [{ param: 'kf', values: [8, 40] }] })).toBe('vary.0');
    expect(() => expandSweep(parseSweepSpec({ ...good, vary: [{ param: 'kf', values: [8, 40] }] }))).toThrow(/kf = 40/);
  });

  it('spaces a logarithmic range evenly in log, ends exact', () => {
    const v = axisValues({ param: 'eps', logRange: { from: 0.01, to: 1, count: 5 } }) as number[];
    expect(v[0]).toBe(0.01);
    expect(v[4]).toBe(1);
    for (let k = 1; k < 5; k++) expect(Math.log(v[k] / v[k - 1])).toBeCloseTo(Math.log(10) / 2, 10);
    expect(axisValues({ param: 'beta', logRange: { from: 20, to: 80, count: 3 } })).toEqual([20, 40, 80]);
  });

  it('expands every combination times the replicas, with deterministic distinct ids', () => {
    const spec = parseSweepSpec({
      ...good,
      vary: [
        { param: 'beta', values: [5, 20] },
        { param: 'mu', logRange: { from: 0.05, to: 0.2, count: 3 } },
      ],
    });
    const jobs = expandSweep(spec);
    expect(jobs).toHaveLength(2 * 3 * 2);
    expect(jobs.map((j) => j.index)).toEqual([...Array(12).keys()]);
    expect(jobs[0].point).toEqual({ beta: 5, mu: 0.05 });
    expect(jobs[1]).toMatchObject({ replica: 1, seed: 2, point: { beta: 5, mu: 0.05 } });
    expect(jobs[11].point).toEqual({ beta: 20, mu: 0.2 });
    expect(new Set(jobs.map((j) => j.id)).size).toBe(12);
    expect(expandSweep(spec).map((j) => j.id)).toEqual(jobs.map((j) => j.id));
    // A run keeps its id when the sweep around it changes.
    const wider = expandSweep(parseSweepSpec({ ...good, vary: [{ param: 'beta', values: [2, 5, 20] }] }));
    const narrow = expandSweep(parseSweepSpec(good));
    expect(wider.map((j) => j.id)).toEqual(expect.arrayContaining(narrow.map((j) => j.id)));
  });

  it('starts from a preset when asked, under the base', () => {
    const jobs = expandSweep(
      parseSweepSpec({
        preset: 'jets',
        base: { nx: 64, ny: 64, kf: 16 },
        vary: [{ param: 'beta', values: [40] }],
        length: { steps: 10 },
      }),
    );
    expect(jobs[0].params).toMatchObject({ nx: 64, kf: 16, nu_order: 8, force_zonal: false, beta: 40 });
  });
});
