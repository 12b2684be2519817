import { Model } from '../lib/model/model';
import type { StepThreads } from '../lib/model/threadTeam';
import { DEFAULT_PARAMS, type ModelParams } from '../lib/model/params';
import { scaledHyperviscosity } from '../lib/plan/gridHyperviscosity';
import { msPerCall } from './timing';

/**
 * The parameters timed at size n: the default scenario on an n × n grid, with a developed random
 * state (so no arithmetic runs on zeros), a fixed step at CFL ≈ 0.25, and the forcing annulus moved
 * inward where the default one would not fit the grid, and ν rescaled to the grid as every run's is
 * (the default's damping rate at k_max). Cost does not depend on the values.
 */
export function benchParams(n: number): ModelParams {
  const kept = Math.floor(n / 3);
  const kf = Math.min(DEFAULT_PARAMS.kf, Math.floor(kept / 2));
  return {
    ...DEFAULT_PARAMS,
    nx: n,
    ny: n,
    nu: scaledHyperviscosity(DEFAULT_PARAMS, { nx: n, ny: n }),
    kf,
    dkf: Math.min(DEFAULT_PARAMS.dkf, kf / 4),
    init_energy: 0.5,
    cfl: 0,
    dt: (0.125 * 2 * Math.PI) / n,
  };
}

/**
 * The two-layer parameters timed at size n: benchParams with two equal layers, k_d = 8 and a modest
 * imposed shear (the stirring stays on as an extra). Cost does not depend on the values.
 */
export function twoLayerBenchParams(n: number): ModelParams {
  return { ...benchParams(n), layers: 2, shear: 0.5, depth_ratio: 1, kd: 8 };
}

export interface StepTiming {
  n: number;
  /** Threads the step ran on, the calling one included. */
  threads: number;
  ms_per_step: number;
  scheme: string;
}

/**
 * Milliseconds per default step at n × n, on `threads` (null: the calling thread alone), of the
 * one-layer model or (layers = 2) the two-layer one.
 */
export function timeStep(n: number, threads: StepThreads | null = null, layers: 1 | 2 = 1): StepTiming {
  const p = layers === 2 ? twoLayerBenchParams(n) : benchParams(n);
  const model = new Model(p, false, threads);
  model.step(20); // let the JIT settle on the real code path
  const ms = msPerCall(() => model.step(), { warmup: 3, batches: n >= 512 ? 5 : 7, batchMs: n >= 512 ? 1500 : 500 });
  const count = model.threadCount;
  // The helpers go back to waiting for a team, so the next size's timing has the cores to itself.
  threads?.release();
  return { n, threads: count, ms_per_step: ms, scheme: p.scheme };
}
