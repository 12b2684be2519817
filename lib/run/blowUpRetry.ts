import type { Checkpoint } from '../model/checkpoint';
import type { BlowUpError } from '../model/stepper';

/**
 * What happens when a run blows up (lib/model/stepper.ts: a non-finite state, or a CFL number past
 * CFL_LIMIT): either it stops there, or it goes back to its last checkpoint and tries again with a
 * smaller time step. The usual cause is a step too long for the flow's speed (a fixed dt set for a
 * calmer state, or an adaptive step whose CFL target lets the speed outrun it), and halving the step
 * halves the CFL number; at most `maxRetries` times in the run, so an unstable configuration still
 * ends, with its report.
 */
export type BlowUpPolicy = { kind: 'stop' } | { kind: 'retry'; maxRetries: number };

export const DEFAULT_MAX_RETRIES = 3;

/** The model's blow-up report, under the summary's snake_case keys (model units). */
export interface BlowUpReport {
  time: number;
  steps: number;
  dt: number;
  cfl: number;
  max_u: number;
  max_v: number;
  reason: string;
}

/** One retry: the blow-up, the checkpoint gone back to, and the step before and after. */
export interface RetryRecord {
  attempt: number;
  blow_up: BlowUpReport;
  restarted_at: { time: number; steps: number };
  dt: { from: number; to: number };
  cfl: { from: number; to: number };
}

export function blowUpReport(e: BlowUpError): BlowUpReport {
  const r = e.report;
  return { time: r.time, steps: r.steps, dt: r.dt, cfl: r.cfl, max_u: r.maxU, max_v: r.maxV, reason: r.reason };
}

/**
 * The checkpoint to restart from after a blow-up: the same state, clock and random stream, with the
 * time step dt halved, and with an adaptive step (cfl > 0) its CFL target halved too. The step in use
 * is the smaller of the one saved and the new dt. Restoring it gives exactly what resuming a checkpoint
 * written after the retry gives, so a retried run resumes bit for bit as well.
 */
export function retryCheckpoint(cp: Checkpoint): Checkpoint {
  const dt = cp.params.dt / 2;
  const cfl = cp.params.cfl / 2;
  return {
    ...cp,
    params: { ...cp.params, dt, cfl },
    dt: Math.min(cp.dt, dt),
    qHat: cp.qHat.slice(),
    rng: [...cp.rng] as unknown as Checkpoint['rng'],
  };
}

/** The record of a retry from `cp` after `e`. */
export function retryRecord(attempt: number, e: BlowUpError, cp: Checkpoint): RetryRecord {
  return {
    attempt,
    blow_up: blowUpReport(e),
    restarted_at: { time: cp.time, steps: cp.steps },
    dt: { from: cp.params.dt, to: cp.params.dt / 2 },
    cfl: { from: cp.params.cfl, to: cp.params.cfl / 2 },
  };
}

/** "blew up at t = 1.25, step 250: CFL number above 1.5 (dt = 0.05, CFL = 1.62, max|u| = 3.1, max|v| = 2.9)" */
export function describeBlowUp(r: BlowUpReport): string {
  const p = (x: number) => (Number.isFinite(x) ? x.toPrecision(4) : String(x));
  return `blew up at t = ${r.time.toPrecision(6)}, step ${r.steps}: ${r.reason} (dt = ${p(r.dt)}, CFL = ${p(r.cfl)}, max|u| = ${p(r.max_u)}, max|v| = ${p(r.max_v)})`;
}
