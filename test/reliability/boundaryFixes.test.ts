import { describe, expect, it } from 'vitest';
import { parseSets } from '../../cli/paramInput';
import { InputError } from '../../lib/inputError';
import { decodeRunFile, encodeRunFile } from '../../lib/io/runFile';
import { Model } from '../../lib/model/model';
import { MonitoredRun } from '../../lib/run/monitoredRun';
import { runSweepJob } from '../../lib/sweep/runSweepJob';
import { formatSweepRecord, joinRecords, parseSweepRecord } from '../../lib/sweep/sweepRecord';
import { expandSweep } from '../../lib/sweep/sweepRuns';
import { MAX_SWEEP_RUNS, parseSweepSpec } from '../../lib/sweep/sweepSpec';
import { validatePlanInput } from '../../lib/plan/planInput';
import { decodeRunLink } from '../../src/share/runLink';
import { PLAN_SEEDS } from './support/planChecks';

/** The boundary faults the property tests (./boundaries/) found, each pinned by its smallest case. */
const small = { nx: 32, ny: 32, kf: 8, dkf: 1.5, dt: 0.01, init_energy: 1 };

function runFileWith(state: Record<string, unknown>): string {
  const m = new Model(small);
  m.step(2);
  const j = JSON.parse(encodeRunFile(m.checkpoint()));
  Object.assign(j.state, state);
  return JSON.stringify(j);
}

const refusal = (f: () => unknown) => {
  try {
    f();
  } catch (e) {
    return e;
  }
  return null;
};

describe('boundary faults found by the property tests, fixed', () => {
  it('run files: an all-zero random state, a clock too far on to advance, a step count past 2^53', () => {
    const zero = refusal(() => decodeRunFile(runFileWith({ rng: [0, 0, 0, 0] })));
    expect(zero).toBeInstanceOf(InputError);
    expect((zero as InputError).source).toBe('run file');
    expect((zero as InputError).field).toBe('state.rng');
    const far = refusal(() => decodeRunFile(runFileWith({ time: 1e17 })));
    expect((far as InputError).field).toBe('state.time');
    expect((far as InputError).reason).toMatch(/too large for the time step 0\.01 to advance it/);
    expect((refusal(() => decodeRunFile(runFileWith({ steps: 2 ** 53 }))) as InputError).field).toBe('state.steps');
    expect(decodeRunFile(runFileWith({ time: 1e10, steps: 2 ** 40 })).steps).toBe(2 ** 40);
  });

  it('a measured run refuses a clock that no longer advances, rather than run for ever', () => {
    // A state far on in time for its step (a checkpoint made in code; run files now refuse it).
    const m = new Model(small);
    const stuck = Model.restore({ ...m.checkpoint(), time: 1e17 });
    const run = new MonitoredRun(stuck, { stop: { kind: 'until', time: 2e17 }, average: 1, sampleEvery: 1 });
    // The model itself refuses the step now; the run's own guard stays behind it.
    expect(() => run.advance()).toThrow(/advance the clock|the model clock no longer advances/);
  });

  it('sweep specs: a count that would expand for hours is refused at once, and inherited names are not parameters', () => {
    const base = { nx: 32, ny: 32, kf: 8, dkf: 1.5 };
    const t0 = Date.now();
    const huge = refusal(() =>
      parseSweepSpec({ base, vary: [{ param: 'beta', values: [5, 20] }], replicas: 2 ** 31, length: { until: 30 } }),
    );
    expect(huge).toBeInstanceOf(InputError);
    expect((huge as InputError).source).toBe('sweep spec');
    expect((huge as InputError).field).toBe('replicas');
    expect((huge as InputError).reason).toMatch(new RegExp(`more than ${MAX_SWEEP_RUNS}`));
    expect(
      (
        refusal(() =>
          parseSweepSpec({
            base,
            vary: [{ param: 'beta', logRange: { from: 1, to: 10, count: 1e9 } }],
            length: { steps: 3 },
          }),
        ) as InputError
      ).field,
    ).toBe('vary');
    expect(
      (
        refusal(() =>
          parseSweepSpec({
            base,
            vary: [{ param: 'beta', values: [1] }],
            length: { steps: 3 },
            fits: { resamples: 2 ** 31 },
          }),
        ) as InputError
      ).field,
    ).toBe('fits.resamples');
    expect(Date.now() - t0).toBeLessThan(1000);
    for (const param of ['toString', '__proto__', 'constructor']) {
      const e = refusal(() =>
        expandSweep(
          parseSweepSpec({ base, vary: [{ param, logRange: { from: 1, to: 10, count: 3 } }], length: { steps: 3 } }),
        ),
      ) as InputError;
      expect(e.field).toBe('vary.0.param');
      expect(e.reason).toMatch(/is not a parameter/);
    }
  });

  it('sweep journals: a line whose summary lacks a key is refused, not joined into a crash', () => {
    const spec = parseSweepSpec({
      base: { nx: 32, ny: 32, kf: 8, dkf: 1.5, mu: 0.5, eps: 0.5, nu: 1e-8, dt: 0.05 },
      vary: [{ param: 'beta', values: [5] }],
      length: { steps: 5 },
      average: 0.25,
      sampleEvery: 0.05,
    });
    const record = runSweepJob(expandSweep(spec)[0], { seconds: () => 0, iso: () => '2026-01-01T00:00:00Z' });
    const { energy: _, ...summary } = record.summary;
    expect(() => parseSweepRecord(JSON.stringify({ ...record, summary }))).toThrow(/^summary\.energy: /);
    // And two records that differ by a missing key would be named, not crash the comparison.
    const other = { ...record, summary: summary as typeof record.summary };
    expect(() =>
      joinRecords([
        { name: 'a', records: [record] },
        { name: 'b', records: [other] },
      ]),
    ).toThrow(/summary\.energy is [-\d.e]+ in one and missing in the other/);
    expect(parseSweepRecord(formatSweepRecord(record))).toEqual(record);
  });

  it('--set: "__proto__" and other inherited names are refused, not dropped', () => {
    for (const key of ['__proto__', 'toString', 'hasOwnProperty'])
      expect(() => parseSets([`${key}=1`])).toThrow(new RegExp(`"${key.replace(/_/g, '_')}" is not a parameter`));
    expect(parseSets(['beta=2pi', 'forcing=steady'])).toEqual({ beta: 2 * Math.PI, forcing: 'steady' });
  });

  it('shared links: a "__proto__" entry and a hexadecimal number are refused, naming the key', () => {
    expect(decodeRunLink('v=1&__proto__=1')).toEqual({ kind: 'bad', message: '“__proto__” is not a parameter' });
    expect(decodeRunLink('v=1&nx=0x20')).toEqual({
      kind: 'bad',
      message: 'nx = “0x20” is not a number in decimal notation',
    });
  });

  it('plan inputs: a subnormal drag time or β is refused, not analysed into NaN predictions', () => {
    const model = PLAN_SEEDS.at(-1) as Record<string, unknown>;
    for (const [change, field] of [
      [{ dragTime: 2.5e-323 }, 'dragTime'],
      [{ rotation: { kind: 'beta', beta: 5e-324 }, dragTime: 2.6e117 }, 'rotation.beta'],
    ] as const) {
      const e = refusal(() => validatePlanInput({ ...model, ...change }));
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).source).toBe('plan input');
      expect((e as InputError).issues.map((i) => i.field)).toEqual([field]);
    }
  });
});
