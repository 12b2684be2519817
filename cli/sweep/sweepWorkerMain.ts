import { parentPort } from 'node:worker_threads';
import { runSweepJob } from '../../lib/sweep/runSweepJob';
import type { SweepJob } from '../../lib/sweep/sweepRuns';

/**
 * A sweep worker: receives one job at a time, runs it, posts back its record. Jobs are sent as
 * plain JSON-like objects; the record goes back the same way.
 */
const clock = { seconds: () => performance.now() / 1000, iso: () => new Date().toISOString() };

parentPort!.on('message', (job: SweepJob) => {
  parentPort!.postMessage(runSweepJob(job, clock));
});
