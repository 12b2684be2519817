import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { SweepRecord } from '../../lib/sweep/sweepRecord';
import type { SweepJob } from '../../lib/sweep/sweepRuns';

/** Default pool size: one worker per core but one (left for the main thread and the machine), at least 1. */
export function defaultJobs(): number {
  return Math.max(1, availableParallelism() - 1);
}

export interface PoolOptions {
  size: number;
  /** Called on the main thread as each run finishes, in finishing order. */
  onRecord(record: SweepRecord): void;
  /** Polled; when true the pool stops its workers at once (unfinished runs are simply not recorded). */
  interrupted(): boolean;
}

/**
 * Run jobs on a pool of worker threads, each worker taking the next job when it finishes one. A run
 * is deterministic, so which worker runs it does not change its bits. Resolves when every job is
 * done or the pool was interrupted; rejects (after stopping every worker) if a worker fails.
 */
export function runInPool(jobs: readonly SweepJob[], opts: PoolOptions): Promise<{ interrupted: boolean }> {
  const queue = [...jobs];
  const size = Math.min(opts.size, queue.length);
  if (size === 0) return Promise.resolve({ interrupted: false });
  return new Promise((resolve, reject) => {
    const workers = new Set<Worker>();
    let settled = false;
    const finish = (outcome: { interrupted: boolean } | Error) => {
      if (settled) return;
      settled = true;
      clearInterval(poll);
      for (const w of workers) void w.terminate();
      if (outcome instanceof Error) reject(outcome);
      else resolve(outcome);
    };
    const poll = setInterval(() => {
      if (opts.interrupted()) finish({ interrupted: true });
    }, 100);
    const feed = (w: Worker) => {
      const job = queue.shift();
      if (job === undefined || opts.interrupted()) {
        workers.delete(w);
        void w.terminate();
        if (workers.size === 0) finish({ interrupted: opts.interrupted() });
        return;
      }
      w.postMessage(job);
    };
    for (let i = 0; i < size; i++) {
      const w = new Worker(new URL('./sweepWorker.js', import.meta.url));
      workers.add(w);
      w.on('message', (record: SweepRecord) => {
        if (settled) return;
        try {
          opts.onRecord(record);
        } catch (e) {
          finish(e instanceof Error ? e : new Error(String(e)));
          return;
        }
        feed(w);
      });
      w.on('error', (e) => finish(new Error(`a sweep worker failed: ${e.message}`)));
      w.on('exit', (code) => {
        if (!settled && workers.has(w)) finish(new Error(`a sweep worker exited unexpectedly (code ${code})`));
      });
      feed(w);
    }
  });
}
