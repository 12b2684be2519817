import { startStepThreads, type NodeStepThreads } from '../cli/stepThreads';
import { timeStep } from './stepBench';
import { ROUND_ARGS, type RoundTiming } from './stepRound';

/**
 * The body of one benchmark round (bench/stepRound.ts): time the step at every size, layer count and
 * thread count asked for, one JSON line per timing on stdout. It loads the step and nothing else.
 */
const spec = JSON.parse(process.argv[process.argv.indexOf(ROUND_ARGS) + 1]) as {
  sizes: number[];
  threads: number[];
  layers: (1 | 2)[];
};
const helpers = new Map<number, NodeStepThreads>();
for (const t of spec.threads) if (t > 1 && !helpers.has(t)) helpers.set(t, await startStepThreads(t));
for (const n of spec.sizes)
  for (const layers of spec.layers)
    for (const t of spec.threads) {
      const timing: RoundTiming = { ...timeStep(n, helpers.get(t)?.threads ?? null, layers), layers, asked_threads: t };
      console.log(JSON.stringify(timing));
    }
for (const h of helpers.values()) await h.close();
