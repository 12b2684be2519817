import type { Checkpoint } from '../lib/model/checkpoint';
import { Model } from '../lib/model/model';
import { BlowUpError } from '../lib/model/stepper';
import { ThreadTeamError, type StepThreads } from '../lib/model/threadTeam';
import {
  blowUpReport,
  describeBlowUp,
  retryCheckpoint,
  retryRecord,
  type BlowUpPolicy,
  type RetryRecord,
} from '../lib/run/blowUpRetry';
import type { MonitoredRun, MonitoredRunState } from '../lib/run/monitoredRun';
import { Breather } from './breather';
import type { CheckpointStore } from './checkpointStore';
import type { OutputCounts, RunOutputs } from './runOutputs';

/**
 * Drives a MonitoredRun to its end for `stria run`: steps in short chunks (so Ctrl-C and progress
 * are heard), takes a checkpoint at every multiple of `checkpointEvery` steps of the model's count
 * (in memory when blow-ups are retried, on disk with a CheckpointStore), and on a blow-up either
 * stops or goes back to the last checkpoint with half the time step (blowUpRetry.ts). On disk the
 * checkpoint is also written when the run ends or is interrupted, and right after a retry, so that
 * a resume never repeats a blow-up already recovered from. A blow-up never overwrites it: the last
 * checkpoint on disk is always a good state.
 */
export interface DriverConfig {
  policy: BlowUpPolicy;
  checkpointEvery: number;
  store: CheckpointStore | null;
  /** The threads a model resumed after a blow-up steps on (docs/threads.md); none: one thread. */
  threads?: StepThreads | null;
  interrupted(): boolean;
  log(line: string): void;
  onProgress?(run: MonitoredRun): void;
}

export type DriveOutcome =
  | { kind: 'done' }
  | { kind: 'interrupted' }
  | { kind: 'blew-up'; error: BlowUpError }
  | { kind: 'checkpoint-failed'; error: Error };

interface Remembered {
  checkpoint: Checkpoint;
  state: MonitoredRunState;
  outputs: OutputCounts;
}

/** Steps between looks at the outside world (interrupts, the progress bar). */
const CHUNK = 25;

export class RunDriver {
  readonly retries: RetryRecord[];
  private last: Remembered | null = null;

  constructor(
    private readonly run: MonitoredRun,
    private readonly outputs: RunOutputs,
    private readonly config: DriverConfig,
    retries: readonly RetryRecord[] = [],
  ) {
    if (!(Number.isInteger(config.checkpointEvery) && config.checkpointEvery > 0))
      throw new RangeError(`checkpointEvery must be a positive integer, got ${config.checkpointEvery}`);
    this.retries = [...retries];
  }

  async drive(): Promise<DriveOutcome> {
    const { run, config } = this;
    const retrying = config.policy.kind === 'retry';
    if (retrying) this.remember();
    const breather = new Breather();
    const every = config.checkpointEvery;
    for (;;) {
      try {
        while (run.stopped === null) {
          const toCheckpoint = every - (run.model.steps % every);
          const over = run.advance(Math.min(CHUNK, toCheckpoint));
          if (!over && run.model.steps % every === 0) {
            if (retrying) this.remember();
            const failed = this.writeToDisk();
            if (failed) return failed;
          }
          config.onProgress?.(run);
          await breather.breathe();
          if (!over && config.interrupted()) return this.writeToDisk() ?? { kind: 'interrupted' };
        }
        return this.writeToDisk() ?? { kind: 'done' };
      } catch (e) {
        if (e instanceof ThreadTeamError) {
          // The step that met it left the state as it was; the model goes on alone, with the same bits.
          config.log(`${e.message}: going on with one thread`);
          continue;
        }
        if (!(e instanceof BlowUpError)) throw e;
        const policy = config.policy;
        if (policy.kind === 'stop') return { kind: 'blew-up', error: e };
        if (this.retries.length >= policy.maxRetries) {
          config.log(`${describeBlowUp(blowUpReport(e))}; no retries left (${policy.maxRetries} made)`);
          return { kind: 'blew-up', error: e };
        }
        this.retry(e, policy.maxRetries);
        const failed = this.writeToDisk();
        if (failed) return failed;
      }
    }
  }

  /** Keep the present state and measurement as the checkpoint a retry goes back to. */
  private remember(): void {
    this.last = {
      checkpoint: this.run.model.checkpoint(),
      state: this.run.saveState(),
      outputs: this.outputs.counts(),
    };
  }

  private retry(e: BlowUpError, max: number): void {
    const from = this.last!;
    const record = retryRecord(this.retries.length + 1, e, from.checkpoint);
    const cp = retryCheckpoint(from.checkpoint);
    this.config.log(
      `${describeBlowUp(record.blow_up)}; retry ${record.attempt} of ${max} from the checkpoint at t = ${cp.time.toPrecision(6)}, step ${cp.steps}, ` +
        `with dt = ${cp.params.dt.toPrecision(4)} (was ${record.dt.from.toPrecision(4)})${cp.params.cfl > 0 ? ` and CFL target ${cp.params.cfl.toPrecision(3)} (was ${record.cfl.from.toPrecision(3)})` : ''}`,
    );
    this.retries.push(record);
    this.outputs.rollBack(from.outputs);
    this.run.rollBack(Model.restore(cp, this.config.threads ?? null), from.state);
    // A second blow-up before the next checkpoint halves the step again from here.
    this.last = { checkpoint: cp, state: from.state, outputs: from.outputs };
  }

  private writeToDisk(): DriveOutcome | null {
    if (!this.config.store) return null;
    try {
      this.config.store.write(this.run, this.outputs, this.retries);
      return null;
    } catch (e) {
      return { kind: 'checkpoint-failed', error: e instanceof Error ? e : new Error(String(e)) };
    }
  }
}
