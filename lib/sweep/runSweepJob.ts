import { Model } from '../model/model';
import { BlowUpError } from '../model/stepper';
import { MonitoredRun } from '../run/monitoredRun';
import { sealRecord, type SweepRecord } from './sweepRecord';
import type { SweepJob } from './sweepRuns';

/** The caller's clock (lib/ reads none): seconds from any origin, and the time now as ISO 8601. */
export interface Clock {
  seconds(): number;
  iso(): string;
}

/**
 * Run one sweep job from rest to the end of its plan and return its record. A blow-up is a result,
 * not a failure (status "blew-up", the error, the summary of the last good state); anything else
 * thrown is a fault of the program and propagates.
 */
export function runSweepJob(job: SweepJob, clock: Clock): SweepRecord {
  const t0 = clock.seconds();
  const run = new MonitoredRun(new Model(job.params), job.plan);
  let error: string | null = null;
  try {
    run.advance();
  } catch (e) {
    if (!(e instanceof BlowUpError)) throw e;
    error = e.message;
  }
  return sealRecord({
    id: job.id,
    index: job.index,
    point: job.point,
    replica: job.replica,
    seed: job.seed,
    params: job.params,
    plan: job.plan,
    status: error === null ? 'done' : 'blew-up',
    stopped: error === null ? run.stopped : null,
    error,
    summary: run.summary(),
    wall_seconds: clock.seconds() - t0,
    finished_at: clock.iso(),
  });
}
