import { readFileSync } from 'node:fs';
import type { Checkpoint } from '../lib/model/checkpoint';
import type { RetryRecord } from '../lib/run/blowUpRetry';
import type { MonitoredRun } from '../lib/run/monitoredRun';
import { decodeCheckpointFile, encodeCheckpointFile, type RunProgress } from '../lib/run/runProgress';
import { isInputError } from '../lib/inputError';
import { UsageError } from './args';
import { removeStaleTemporaries, writeFileAtomic } from './atomicFile';
import type { RunOutputs } from './runOutputs';

/**
 * The checkpoint file of one `stria run` (lib/run/runProgress.ts), replaced atomically each time
 * (atomicFile.ts). The order of writing is what makes a resume exact: first the NetCDF files are
 * flushed to the disk, then the checkpoint that counts their records is written, so a checkpoint
 * never promises records the disk does not hold.
 */
export type ProgressBase = Omit<RunProgress, 'retries' | 'measurement' | 'outputs'> & {
  createdAt: string;
  command: string;
  /** Threads of the run that began the NetCDF files (their stria_threads), when recorded. */
  threads?: number;
};

export class CheckpointStore {
  readonly path: string;
  private readonly base: ProgressBase;
  /** Checkpoints written by this process. */
  written = 0;

  constructor(path: string, base: ProgressBase) {
    this.path = path;
    this.base = base;
    removeStaleTemporaries(path);
  }

  /** Write the run's present state and measurement; throws (the old file stays) when it cannot. */
  write(run: MonitoredRun, outputs: RunOutputs, retries: readonly RetryRecord[]): void {
    outputs.sync();
    const { createdAt, command, threads, ...rest } = this.base;
    const progress: RunProgress = {
      ...rest,
      retries: [...retries],
      outputs: { created_at: createdAt, command, ...(threads === undefined ? {} : { threads }), ...outputs.progress() },
      measurement: run.saveState(),
    };
    // The run file part records the threads the run steps on now.
    const text = encodeCheckpointFile(run.model.checkpoint(), progress, new Date(), run.model.threadCount);
    try {
      writeFileAtomic(this.path, text);
    } catch (e) {
      throw new Error(
        `cannot write the checkpoint ${this.path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}; the previous checkpoint is kept`,
        { cause: e },
      );
    }
    this.written++;
  }
}

/** Read a checkpoint file for `--resume`; every problem is a UsageError naming the file and field. */
export function readCheckpoint(path: string): { checkpoint: Checkpoint; progress: RunProgress } {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw new UsageError(
      `--resume ${path}: cannot read it: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`,
    );
  }
  try {
    return decodeCheckpointFile(text);
  } catch (e) {
    if (isInputError(e, 'checkpoint file')) throw new UsageError(`--resume ${path}: ${e.field}: ${e.reason}`);
    throw e;
  }
}
