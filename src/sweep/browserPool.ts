import { wrap, type Remote } from 'comlink';
import type { SweepRecord } from '../../lib/sweep/sweepRecord';
import type { SweepJob } from '../../lib/sweep/sweepRuns';
import type { SimulationApi } from '../../workers/simulationApi';

/**
 * Workers for a sweep: one per core the browser reports (the run on screen is paused while a sweep
 * runs, so the page leaves the cores to it), 2 when the browser does not say.
 */
export function poolSize(): number {
  return Math.max(1, navigator.hardwareConcurrency || 2);
}

export interface PoolEvents {
  /** A worker took a job. */
  started(job: SweepJob): void;
  /** A job finished (in finishing order). */
  finished(record: SweepRecord): void;
}

/**
 * Runs sweep jobs on a pool of web workers, each taking the next job when it finishes one. They are
 * simulation workers (SimulationApi.runSweepJob: the command line's per-run code) without a live
 * model. A run is deterministic, so which worker ran it changes none of its bits. `cancel` ends every
 * worker at once: unfinished runs are simply not reported.
 */
export class SweepPool {
  private workers: { worker: Worker; api: Remote<SimulationApi> }[] = [];
  private cancelled = false;
  private abort: () => void = () => undefined;
  /** Resolves on cancel: a terminated worker never answers, so waiting runs race against it. */
  private readonly aborted: Promise<null> = new Promise((resolve) => (this.abort = () => resolve(null)));

  async run(jobs: readonly SweepJob[], size: number, events: PoolEvents): Promise<{ cancelled: boolean }> {
    const queue = [...jobs];
    const n = Math.min(size, queue.length);
    for (let i = 0; i < n; i++) {
      const worker = new Worker(new URL('../../workers/simulation.worker.ts', import.meta.url), { type: 'module' });
      this.workers.push({ worker, api: wrap<SimulationApi>(worker) });
    }
    const drain = async (api: Remote<SimulationApi>): Promise<void> => {
      for (let job = queue.shift(); job && !this.cancelled; job = queue.shift()) {
        events.started(job);
        const record = await Promise.race([api.runSweepJob(job), this.aborted]);
        if (record && !this.cancelled) events.finished(record);
      }
    };
    try {
      await Promise.all(this.workers.map((w) => drain(w.api)));
    } catch (e) {
      if (!this.cancelled) throw e;
    } finally {
      this.close();
    }
    return { cancelled: this.cancelled };
  }

  cancel(): void {
    this.cancelled = true;
    this.abort();
    this.close();
  }

  private close(): void {
    for (const w of this.workers) w.worker.terminate();
    this.workers = [];
  }
}
