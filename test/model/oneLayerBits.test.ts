import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startStepThreads, type NodeStepThreads } from '../../cli/stepThreads';
import { stateChecksum, textDigest } from '../../lib/io/digest';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';

/**
 * The one-layer model's bits, pinned: fingerprints (lib/io/digest.ts) of the state and of the last
 * step report of four runs, recorded before the two-layer model was added. Any change to the
 * one-layer path that moves a bit (a reordered sum, a new default, a changed propagator) fails here.
 * Same parameters + seed + steps → same bits [practice: the project's reproducibility rule].
 */
const RUNS: {
  name: string;
  params: Partial<ModelParams>;
  steps: number;
  state: string;
  time: number;
  dt: number;
  report: string;
}[] = [
  {
    name: 'the default scenario at 128², stochastic forcing, 50 steps',
    params: {},
    steps: 50,
    state: '4b99b25b4e538819',
    time: 1.0000000000000004,
    dt: 0.02,
    report: 'c268d406ff82afdb',
  },
  {
    name: '64² with an adaptive step from a random initial state',
    params: {
      nx: 64,
      ny: 64,
      kf: 12,
      dkf: 2,
      eps: 0.05,
      beta: 5,
      nu: 1e-12,
      nu_order: 4,
      dt: 0.05,
      cfl: 0.5,
      init_energy: 0.5,
    },
    steps: 80,
    state: 'b1a9949a6e8c5fe8',
    time: 0.7263063706417734,
    dt: 0.008838834764831846,
    report: '9d5c552c9d894b87',
  },
  {
    name: 'k_d = 4 with large-scale drag',
    params: {
      nx: 64,
      ny: 64,
      kd: 4,
      kf: 12,
      dkf: 2,
      beta: 10,
      nu: 1e-12,
      nu_order: 4,
      init_energy: 0.2,
      mu_ls: 0.1,
      k_ls: 2,
    },
    steps: 60,
    state: 'fd740b59562e1a02',
    time: 1.2000000000000006,
    dt: 0.02,
    report: '721caeab12dbb923',
  },
  {
    name: 'steady forcing, fixed step',
    params: {
      nx: 64,
      ny: 64,
      forcing: 'steady',
      kf: 8,
      dkf: 1.5,
      mu: 0.1,
      eps: 0.1,
      beta: 3,
      nu: 1e-8,
      nu_order: 2,
      cfl: 0,
      dt: 0.01,
    },
    steps: 60,
    state: '2befb60933996192',
    time: 0.6000000000000003,
    dt: 0.01,
    report: 'f83d47f5e510ec6e',
  },
];

describe('the one-layer model keeps its bits', () => {
  for (const run of RUNS) {
    it(run.name, () => {
      const m = new Model(run.params);
      m.step(run.steps);
      expect(stateChecksum(m.qHat)).toBe(run.state);
      expect(m.time).toBe(run.time);
      expect(m.dt).toBe(run.dt);
      expect(textDigest(JSON.stringify(m.report))).toBe(run.report);
    });
  }
});

// The same pins on three threads (docs/threads.md): the number of threads is not part of the bits.
describe('the one-layer model keeps its bits on three threads', () => {
  let threads: NodeStepThreads;
  beforeAll(async () => {
    threads = await startStepThreads(3);
  });
  afterAll(async () => {
    await threads?.close();
  });
  for (const run of RUNS) {
    it(run.name, () => {
      const m = new Model(run.params, false, threads.threads);
      expect(m.threadCount).toBe(3);
      m.step(run.steps);
      expect(stateChecksum(m.qHat)).toBe(run.state);
      expect(m.time).toBe(run.time);
      expect(m.dt).toBe(run.dt);
      expect(textDigest(JSON.stringify(m.report))).toBe(run.report);
    });
  }
});
