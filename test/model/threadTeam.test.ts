import { Worker } from 'node:worker_threads';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startStepThreads, type NodeStepThreads } from '../../cli/stepThreads';
import { stateChecksum, textDigest } from '../../lib/io/digest';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';
import { BlowUpError } from '../../lib/model/stepper';
import { StepThreads, ThreadTeamError } from '../../lib/model/threadTeam';

// Real threads (Node worker_threads, as `stria run --threads N` starts them): 1, 2 and 3 threads
// give the same bits, one layer and two [practice: the project's reproducibility rule;
// docs/threads.md]. The partitions themselves are covered for more counts in stepTeam.test.ts.

function fingerprint(m: Model): string {
  return `${stateChecksum(m.qHat)} ${m.time} ${m.dt} ${textDigest(JSON.stringify(m.report))}`;
}

const ONE_LAYER: Partial<ModelParams> = {
  nx: 64,
  ny: 128,
  Ly: 4 * Math.PI,
  kf: 12,
  dkf: 2,
  dt: 0.05,
  cfl: 0.8,
  init_energy: 0.5,
  nu: 1e-12,
};
const TWO_LAYERS: Partial<ModelParams> = {
  layers: 2,
  nx: 128,
  ny: 64,
  Ly: Math.PI,
  kd: 8,
  shear: 1.5,
  depth_ratio: 0.5,
  kf: 12,
  dkf: 2,
  dt: 0.05,
  cfl: 0.6,
  init_energy: 0.2,
};

describe('threads', () => {
  let two: NodeStepThreads;
  let three: NodeStepThreads;

  beforeAll(async () => {
    [two, three] = await Promise.all([startStepThreads(2), startStepThreads(3)]);
  });

  afterAll(async () => {
    await Promise.all([two?.close(), three?.close()]);
  });

  for (const [name, params] of [
    ['one layer', ONE_LAYER],
    ['two layers', TWO_LAYERS],
  ] as const) {
    it(`1, 2 and 3 threads give the same bits: ${name}`, () => {
      const solo = new Model(params);
      solo.step(50);
      for (const t of [two, three]) {
        const m = new Model(params, false, t.threads);
        expect(m.threadCount).toBe(t.threads.count);
        m.step(50);
        expect(fingerprint(m), `${t.threads.count} threads`).toBe(fingerprint(solo));
      }
    });
  }

  it('a run that changes its threads on the way, and is checkpointed and resumed, keeps the bits', () => {
    const solo = new Model(ONE_LAYER);
    solo.step(60);
    const m = new Model(ONE_LAYER, false, three.threads);
    m.step(15);
    m.useThreads(two.threads);
    expect(m.threadCount).toBe(2);
    m.step(15);
    const resumed = Model.restore(m.checkpoint(), three.threads);
    resumed.step(15);
    resumed.useThreads(null);
    expect(resumed.threadCount).toBe(1);
    resumed.step(15);
    expect(fingerprint(resumed)).toBe(fingerprint(solo));
  });

  it('a new model on the same threads takes them over; the old one goes on alone, with the same bits', () => {
    const a = new Model(TWO_LAYERS, false, three.threads);
    a.step(10);
    const b = a.reconfigure({ nx: 64 }); // a new grid: a new Model on the same threads
    expect(b.threadCount).toBe(3);
    expect(a.threadCount).toBe(1);
    a.step(10);
    b.step(10);
    const solo = new Model(TWO_LAYERS);
    solo.step(20);
    expect(fingerprint(a)).toBe(fingerprint(solo));
  });

  it('a blow-up on threads is the blow-up of one thread, and leaves the state as it was', () => {
    const wild = { ...ONE_LAYER, cfl: 0, dt: 0.4, init_energy: 5 };
    const stop = (m: Model): string => {
      try {
        m.step(200);
      } catch (e) {
        if (e instanceof BlowUpError) return `${e.message} ${fingerprint(m)}`;
        throw e;
      }
      return 'no blow-up';
    };
    const want = stop(new Model(wild));
    expect(want).not.toBe('no blow-up');
    expect(stop(new Model(wild, false, three.threads))).toBe(want);
  });

  it('a helper that cannot join is refused plainly; the model steps on one thread with the same bits', async () => {
    const w = new Worker(new URL('../../cli/stepThread.js', import.meta.url));
    const errors: Error[] = [];
    w.on('error', (e) => errors.push(e));
    await new Promise((resolve) => w.once('message', resolve));
    // Invitations that lose the last shared array: the helper cannot build the step.
    const lossy = new StepThreads(1, (_, message) =>
      w.postMessage({ ...message, buffers: message.buffers.slice(0, -1) }),
    );
    const m = new Model(ONE_LAYER);
    expect(() => m.useThreads(lossy)).toThrow(ThreadTeamError);
    expect(m.threadCount).toBe(1);
    expect(lossy.failed).toBe(true);
    m.step(20);
    const solo = new Model(ONE_LAYER);
    solo.step(20);
    expect(fingerprint(m)).toBe(fingerprint(solo));
    await w.terminate();
    expect(errors.map((e) => e.message).join()).toMatch(/does not match/);
  });

  // The app's way (workers/webStepThreads.ts): join does not wait for the helpers, so phases may be
  // dispatched before a helper has built its side; it serves them from the team's first generation.
  it('helpers that join after the first phases were dispatched give the same bits', async () => {
    const w = new Worker(new URL('../../cli/stepThread.js', import.meta.url));
    await new Promise((resolve) => w.once('message', resolve));
    const late = new StepThreads(1, (_, message) => setTimeout(() => w.postMessage(message), 200), false);
    const m = new Model(ONE_LAYER);
    m.useThreads(late);
    expect(m.threadCount).toBe(2);
    await new Promise((resolve) => setTimeout(resolve, 400));
    m.step(10);
    const solo = new Model(ONE_LAYER);
    solo.step(10);
    expect(fingerprint(m)).toBe(fingerprint(solo));
    // A failure before joining is met by the first phase: a ThreadTeamError, the state as it was.
    const lossy = new StepThreads(
      1,
      (_, message) => w.postMessage({ ...message, buffers: message.buffers.slice(0, -1) }),
      false,
    );
    const errors: Error[] = [];
    w.on('error', (e) => errors.push(e));
    const state = (x: Model) => `${stateChecksum(x.qHat)} ${x.time} ${x.dt} ${x.steps}`;
    const before = state(m);
    m.useThreads(lossy);
    await new Promise((resolve) => setTimeout(resolve, 400));
    expect(() => m.step(1)).toThrow(ThreadTeamError);
    expect(state(m)).toBe(before);
    expect(m.threadCount).toBe(1);
    m.step(1);
    solo.step(1);
    expect(fingerprint(m)).toBe(fingerprint(solo));
    await w.terminate();
  });
});
