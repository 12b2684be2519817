import fc from 'fast-check';
import { parentPort, workerData } from 'node:worker_threads';
import type { Boundary } from './boundary';
import { previewValue } from './boundary';

/**
 * Runs one boundary's property with fast-check inside a worker thread, announcing every case before
 * it runs, so the test runner on the main thread can stop the worker when one case takes too long
 * (a synchronous hang cannot be timed out from within). Posts the tally of answers at the end.
 */
interface Job {
  module: string;
  numRuns: number;
  seed: number;
}

const job = workerData as Job;
const mod = (await import(job.module)) as { boundary: Boundary<unknown> };
const b = mod.boundary;
const tally: Record<string, number> = {};
let index = 0;
const result = fc.check(
  fc.property(b.arbitrary, (input) => {
    parentPort!.postMessage({ kind: 'case', index: index++, preview: (b.preview ?? previewValue)(input) });
    const answer = b.check(input);
    tally[answer] = (tally[answer] ?? 0) + 1;
  }),
  { numRuns: job.numRuns, seed: job.seed, endOnFailure: false },
);
parentPort!.postMessage({
  kind: 'done',
  numRuns: result.numRuns,
  failed: result.failed,
  counterexample: result.counterexample ? (b.preview ?? previewValue)(result.counterexample[0]) : null,
  error:
    result.errorInstance instanceof Error
      ? `${result.errorInstance.name}: ${result.errorInstance.message}`
      : result.failed
        ? String(result.errorInstance)
        : null,
  seed: result.seed,
  path: result.counterexamplePath,
  tally,
});
