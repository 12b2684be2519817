import { execFileSync } from 'node:child_process';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { StepTiming } from './stepBench';

/**
 * One round of step timings in a Node process of its own, which loads the step and nothing else.
 *
 * Why not in the benchmark's own process: on the development machine (2026-12-05) the same step
 * timed in one process ran at 5.6–6.1 ms at 256² on one thread, but 7.0–7.5 ms, in every one of
 * a dozen processes, once the process had also loaded some unrelated modules (the benchmark's draw and
 * time-to-jets code, fft.js, comlink; not others), with every function of the step uniformly slower
 * (a matter of how the engine compiles and places the code, not of the step); and a process now and then
 * ran the whole step 1.6× slower from start to end (9–11 ms, against 5.7 ms in the next process).
 * A command-line run (`stria run`) stepped at the lean figure. So each round starts a fresh process
 * that loads only the step: one slow process spoils one round, which the median over rounds resists,
 * and unrelated code cannot shift the figures. The C/FFTW reference is a process of its own anyway.
 */
export interface RoundTiming extends StepTiming {
  layers: 1 | 2;
  /** The thread count asked for (StepTiming.threads is what the step ran on). */
  asked_threads: number;
}

/** The argument that carries the round's specification (JSON) to the child. */
export const ROUND_ARGS = '--round';

const here = dirname(fileURLToPath(import.meta.url));

/** Time the step at each size × layer count × thread count, in that order, in a fresh process. */
export function stepRound(sizes: number[], threads: number[], layers: (1 | 2)[] = [1]): RoundTiming[] {
  const out = execFileSync(
    process.execPath,
    [resolve(here, 'stepRoundChild.js'), ROUND_ARGS, JSON.stringify({ sizes, threads, layers })],
    { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'], maxBuffer: 1 << 24 },
  );
  return out
    .split('\n')
    .filter((l) => l.startsWith('{'))
    .map((l) => JSON.parse(l) as RoundTiming);
}
