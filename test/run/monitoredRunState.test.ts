import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { captureState, restoreState } from '../../lib/run/dataState';
import { MonitoredRun, type MonitoredRunState } from '../../lib/run/monitoredRun';
import { resolveRunPlan, type RunLengthRequest } from '../../lib/run/runPlan';
import { stateFromJson, stateToJson } from '../../lib/run/stateJson';

const params = {
  nx: 32,
  ny: 32,
  kf: 8,
  dkf: 1.5,
  beta: 10,
  mu: 0.5,
  eps: 0.5,
  nu: 1e-8,
  dt: 0.05,
  cfl: 0.8,
  init_energy: 0.2,
};
const request: RunLengthRequest = { untilSteady: true, steadyTolerance: 0.02, sampleEvery: 0.1, average: 2 };
const planOf = (m: Model) => resolveRunPlan(m.params, request);

/** The run taken straight through: its summary and final state. */
function straight(): { summary: string; q: number[]; steps: number } {
  const m = new Model(params);
  const run = new MonitoredRun(m, planOf(m));
  run.advance();
  return { summary: JSON.stringify(run.summary()), q: Array.from(m.qHat), steps: m.steps };
}

const viaJson = (s: MonitoredRunState) =>
  stateFromJson(JSON.parse(JSON.stringify(stateToJson(s as never)))) as unknown as MonitoredRunState;

describe('the measurement of a run, saved and restored', () => {
  const whole = straight();

  it('resumes in a new run from a checkpoint, through JSON, to the same summary and bits', () => {
    const m = new Model(params);
    const first = new MonitoredRun(m, planOf(m));
    first.advance(57);
    const cp = m.checkpoint();
    const saved = viaJson(first.saveState());
    const again = new MonitoredRun(Model.restore(cp), planOf(m), {}, { time: 0, steps: 0 });
    again.restoreState(saved);
    again.advance();
    expect(again.stopped).toBe('steady');
    expect(again.model.steps).toBe(whole.steps);
    expect(JSON.stringify(again.summary())).toBe(whole.summary);
    expect(Array.from(again.model.qHat)).toEqual(whole.q);
  });

  it('rolls back to a checkpoint and goes on as if the steps after it had never been taken', () => {
    const m = new Model(params);
    const run = new MonitoredRun(m, planOf(m));
    run.advance(40);
    const cp = m.checkpoint();
    const state = run.saveState();
    run.advance(33);
    run.rollBack(Model.restore(cp), state);
    expect(run.model.steps).toBe(40);
    run.advance();
    expect(JSON.stringify(run.summary())).toBe(whole.summary);
    expect(Array.from(run.model.qHat)).toEqual(whole.q);
  });

  it('refuses a state that does not fit, changing nothing', () => {
    const small = new Model(params);
    const a = new MonitoredRun(small, planOf(small));
    a.advance(20);
    const big = new Model({ ...params, nx: 64, ny: 64 });
    const b = new MonitoredRun(big, planOf(big));
    b.advance(5);
    const before = JSON.stringify(stateToJson(b.saveState() as never));
    expect(() => b.restoreState(a.saveState())).toThrow(expect.objectContaining({ source: 'state' }));
    expect(() => b.restoreState(a.saveState())).toThrow(
      /monitor\.(hovmoller|means|budget)\.\w+: holds \d+ values, the object \d+/,
    );
    expect(JSON.stringify(stateToJson(b.saveState() as never))).toBe(before);
  });

  it('captures plain data only, and says which field is not', () => {
    class Plan {
      scratch = new Float64Array(4);
    }
    const acc = {
      count: 3,
      sums: new Float64Array([1, 2]),
      tags: ['a'],
      window: { span: 2 },
      tLast: -Infinity,
      plan: new Plan(),
    };
    expect(() => captureState(acc)).toThrow(/\(state\)\.plan: holds a Plan, which is not plain data/);
    const s = captureState(acc, ['plan']);
    acc.count = 9;
    acc.sums[0] = 7;
    acc.window.span = 5;
    const sums = acc.sums;
    restoreState(acc, stateFromJson(JSON.parse(JSON.stringify(stateToJson(s)))) as never, ['plan']);
    expect(acc).toMatchObject({ count: 3, tags: ['a'], window: { span: 2 }, tLast: -Infinity });
    expect(acc.sums).toBe(sums); // written back into its own buffer
    expect(Array.from(acc.sums)).toEqual([1, 2]);
    expect(() => restoreState(acc, { ...s, extra: 1 }, ['plan'])).toThrow(/it has unknown extra/);
    expect(Object.is(stateFromJson(stateToJson(-0)), -0)).toBe(true);
    expect(stateFromJson(stateToJson(NaN))).toBeNaN();
    expect(() => stateFromJson({ $n: 'nope' })).toThrow(expect.objectContaining({ source: 'state' }));
    expect(() => stateFromJson({ $a: 'Float64Array', b64: 'AAA' })).toThrow(/"b64" must be padded standard base64/);
  });
});
